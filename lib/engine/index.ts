/**
 * Gusset frame engine: 2D frames and trusses by the direct stiffness method. Pure TypeScript (no I/O), so
 * the server, the browser and batch workers run the same numbers. Sign conventions: lib/engine/README.md.
 */
export { analyze, linearSystem, type LinearSystem } from "./analyze";
export { ENGINE_VERSION, ENGINE_IDENTITY, engineIdentityLabel, type EngineIdentity } from "./version";
export type { AnalysisOutcome, AnalysisResult, AnalysisStats, AnalysisTimings } from "./analysis-types";
export type { CaseResult, EquilibriumResidual, LoadSource, ReadonlyVector } from "./results";
export type { EnvelopeResult, VectorEnvelope } from "./combinations";
export type { EngineError, EngineWarning, ErrorKind } from "./diagnostics";
export { DOF_NAMES, DOFS_PER_NODE, type DofName } from "./dofs";
export * from "./model";
export * from "./access";
export {
  memberDiagram,
  memberEnvelope,
  memberForces,
  DIAGRAM_QUANTITIES,
  type DiagramQuantity,
  type DiagramValues,
  type MemberDiagram,
  type MemberEnvelope,
  type MemberForces,
  type SectionForces,
  type DiagramOptions,
} from "./diagrams";
export type { Extreme } from "./piecewise";
export { resultToJson, resultToCanonicalJson, canonicalJson, type Json, type SerializeOptions } from "./serialize";
export { restoreResult, type RestoreOutcome } from "./restore";
export type { SymmetricCsc } from "./sparse";
