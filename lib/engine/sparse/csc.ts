import type { AdjacencyGraph, SymmetricCsc } from "./types";

/** y = A x using both triangles implied by the lower storage (for residuals ‖Ax − b‖). */
export function multiplySymmetric(a: SymmetricCsc, x: Float64Array): Float64Array {
  const { n, colPtr, rowIdx, values } = a;
  if (x.length !== n) throw new Error(`multiplySymmetric: vector length ${x.length} does not match n = ${n}`);
  const y = new Float64Array(n);
  for (let j = 0; j < n; j++) {
    const xj = x[j];
    let sum = 0;
    for (let p = colPtr[j]; p < colPtr[j + 1]; p++) {
      const i = rowIdx[p];
      const v = values[p];
      if (i === j) {
        sum += v * xj;
      } else {
        y[i] += v * xj;
        sum += v * x[i];
      }
    }
    y[j] += sum;
  }
  return y;
}

/** Diagonal of A (zero where not stored). */
export function extractDiagonal(a: SymmetricCsc): Float64Array {
  const diag = new Float64Array(a.n);
  for (let j = 0; j < a.n; j++) {
    for (let p = a.colPtr[j]; p < a.colPtr[j + 1]; p++) {
      if (a.rowIdx[p] === j) diag[j] += a.values[p];
    }
  }
  return diag;
}

/**
 * Graph of A's off-diagonal pattern, both directions. With blockSize b > 1, equations
 * k*b .. k*b+b-1 collapse into vertex k, so the graph has n/b vertices.
 */
export function buildAdjacency(a: SymmetricCsc, blockSize = 1): AdjacencyGraph {
  const b = blockSize;
  if (!Number.isInteger(b) || b < 1 || a.n % b !== 0) {
    throw new Error(`buildAdjacency: blockSize ${b} must be a positive integer dividing n = ${a.n}`);
  }
  const nv = a.n / b;
  const { colPtr, rowIdx } = a;
  // Collect distinct lower edges (I > J) per vertex J, deduplicated with a marker.
  const mark = new Int32Array(nv).fill(-1);
  const lowerPtr = new Int32Array(nv + 1);
  const lowerIdx = new Int32Array(Math.max(1, a.rowIdx.length));
  let count = 0;
  for (let vj = 0; vj < nv; vj++) {
    mark[vj] = vj;
    for (let j = vj * b; j < vj * b + b; j++) {
      for (let p = colPtr[j]; p < colPtr[j + 1]; p++) {
        const vi = b === 1 ? rowIdx[p] : (rowIdx[p] / b) | 0;
        if (mark[vi] !== vj) {
          mark[vi] = vj;
          lowerIdx[count++] = vi;
        }
      }
    }
    lowerPtr[vj + 1] = count;
  }
  // Mirror into full adjacency.
  const ptr = new Int32Array(nv + 1);
  for (let vj = 0; vj < nv; vj++) {
    ptr[vj + 1] += lowerPtr[vj + 1] - lowerPtr[vj];
    for (let p = lowerPtr[vj]; p < lowerPtr[vj + 1]; p++) ptr[lowerIdx[p] + 1]++;
  }
  for (let v = 0; v < nv; v++) ptr[v + 1] += ptr[v];
  const adj = new Int32Array(ptr[nv]);
  const fill = ptr.slice(0, nv);
  for (let vj = 0; vj < nv; vj++) {
    for (let p = lowerPtr[vj]; p < lowerPtr[vj + 1]; p++) {
      const vi = lowerIdx[p];
      adj[fill[vj]++] = vi;
      adj[fill[vi]++] = vj;
    }
  }
  return { n: nv, ptr, adj };
}

/** Pattern-plus-values of a square sparse matrix in CSC (rows not necessarily sorted). */
export interface CscMatrix {
  n: number;
  colPtr: Int32Array;
  rowIdx: Int32Array;
  values: Float64Array;
}

/** Lower triangle of C = P A Pᵀ where pinv[i] is the new position of original index i; rows unsorted. */
export function permuteToLower(a: SymmetricCsc, pinv: Int32Array): CscMatrix {
  const { n, colPtr, rowIdx, values } = a;
  const outPtr = new Int32Array(n + 1);
  for (let j = 0; j < n; j++) {
    const pj = pinv[j];
    for (let p = colPtr[j]; p < colPtr[j + 1]; p++) {
      const pi = pinv[rowIdx[p]];
      outPtr[(pi < pj ? pi : pj) + 1]++;
    }
  }
  for (let k = 0; k < n; k++) outPtr[k + 1] += outPtr[k];
  const nnz = outPtr[n];
  const outRow = new Int32Array(nnz);
  const outVal = new Float64Array(nnz);
  const fill = outPtr.slice(0, n);
  for (let j = 0; j < n; j++) {
    const pj = pinv[j];
    for (let p = colPtr[j]; p < colPtr[j + 1]; p++) {
      const pi = pinv[rowIdx[p]];
      const dst = pi < pj ? fill[pi]++ : fill[pj]++;
      outRow[dst] = pi < pj ? pj : pi;
      outVal[dst] = values[p];
    }
  }
  return { n, colPtr: outPtr, rowIdx: outRow, values: outVal };
}

/** Pattern of the transpose (for a lower-triangular input: the upper triangle, i.e. the rows of L's pattern in A). */
export function transposePattern(c: CscMatrix): { colPtr: Int32Array; rowIdx: Int32Array } {
  const { n, colPtr, rowIdx } = c;
  const nnz = colPtr[n];
  const tPtr = new Int32Array(n + 1);
  for (let p = 0; p < nnz; p++) tPtr[rowIdx[p] + 1]++;
  for (let k = 0; k < n; k++) tPtr[k + 1] += tPtr[k];
  const tIdx = new Int32Array(nnz);
  const fill = tPtr.slice(0, n);
  for (let j = 0; j < n; j++) {
    for (let p = colPtr[j]; p < colPtr[j + 1]; p++) tIdx[fill[rowIdx[p]]++] = j;
  }
  return { colPtr: tPtr, rowIdx: tIdx };
}
