// Sparse symmetric positive-definite solver of the frame engine: triplet assembly, fill-reducing
// orderings, and a supernodal Cholesky (LLᵀ) factorisation with singularity reporting in original equation numbers.
export type { CholeskyFactor, FactorOptions, FactorResult, FactorStats, OrderingMethod, SymmetricCsc } from "./types";
export { SymmetricTripletBuilder } from "./triplets";
export { multiplySymmetric } from "./csc";
export { computeOrdering } from "./ordering";
export { factorizeSymmetric } from "./cholesky";
export { FactorWorkspace } from "./workspace";
