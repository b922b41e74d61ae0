import type { FactorWorkspace } from "./workspace";

/** Lower triangle (incl. diagonal) of a symmetric matrix in compressed sparse column form; row indices sorted ascending within each column, no duplicates. */
export interface SymmetricCsc {
  n: number;
  colPtr: Int32Array;
  rowIdx: Int32Array;
  values: Float64Array;
}

export type OrderingMethod = "amd" | "rcm" | "natural";

export interface FactorOptions {
  /** Default "amd". */
  ordering?: OrderingMethod;
  /** When every node carries the same number of equations laid out contiguously (node k -> k*b .. k*b+b-1), order the compressed node graph (n/b vertices) and expand; much faster ordering. Default 1. */
  blockSize?: number;
  /** A pivot d_k with d_k <= pivotTolerance * A_kk (original diagonal) or A_kk <= 0 means singular there. Default 1e-10. */
  pivotTolerance?: number;
  /**
   * Storage for L reused across factorisations (see FactorWorkspace): the factor is then valid only until the
   * next factorisation with the same workspace. Default: L gets storage of its own.
   */
  workspace?: FactorWorkspace;
}

export interface FactorStats {
  orderingMs: number;
  symbolicMs: number;
  numericMs: number;
  /** Structural nonzeros of L, diagonal included. */
  nnzL: number;
  n: number;
}

export interface CholeskyFactor {
  readonly n: number;
  readonly stats: FactorStats;
  /** Solves A x = b; b is not modified. */
  solve(b: Float64Array): Float64Array;
  /** Solves A X = B for several right-hand sides in one pass over the factor; none is modified. */
  solveMany(bs: ReadonlyArray<Float64Array>): Float64Array[];
}

export type FactorResult =
  | { ok: true; factor: CholeskyFactor }
  | {
      ok: false;
      kind: "not-positive-definite";
      /** ORIGINAL (unpermuted) equation index. */
      equation: number;
      pivot: number;
      stats: FactorStats;
    };

/** Adjacency of an undirected graph without self-loops, both directions stored. */
export interface AdjacencyGraph {
  n: number;
  ptr: Int32Array;
  adj: Int32Array;
}
