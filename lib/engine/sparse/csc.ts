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

/** Both triangles of A (diagonal once), for gathering whole columns in any order. */
export function expandSymmetric(a: SymmetricCsc): CscMatrix {
  const { n, colPtr, rowIdx, values } = a;
  const ptr = new Int32Array(n + 1);
  for (let j = 0; j < n; j++) {
    for (let p = colPtr[j]; p < colPtr[j + 1]; p++) {
      const i = rowIdx[p];
      ptr[j + 1]++;
      if (i !== j) ptr[i + 1]++;
    }
  }
  for (let k = 0; k < n; k++) ptr[k + 1] += ptr[k];
  const idx = new Int32Array(ptr[n]);
  const val = new Float64Array(ptr[n]);
  const fill = ptr.slice(0, n);
  for (let j = 0; j < n; j++) {
    for (let p = colPtr[j]; p < colPtr[j + 1]; p++) {
      const i = rowIdx[p];
      let q = fill[j]++;
      idx[q] = i;
      val[q] = values[p];
      if (i !== j) {
        q = fill[i]++;
        idx[q] = j;
        val[q] = values[p];
      }
    }
  }
  return { n, colPtr: ptr, rowIdx: idx, values: val };
}

/**
 * Lower triangle of C = P A Pᵀ (perm[k] = original index placed k-th, pinv its inverse) from the
 * expanded A; rows unsorted. Gathering column by column in the new order writes sequentially,
 * which is several times faster than scattering entries to random columns once n is large.
 */
export function permuteToLower(full: CscMatrix, perm: Int32Array, pinv: Int32Array): CscMatrix {
  const { n, colPtr, rowIdx, values } = full;
  const nnz = (colPtr[n] + n) / 2;
  const outPtr = new Int32Array(n + 1);
  const outRow = new Int32Array(nnz);
  const outVal = new Float64Array(nnz);
  let q = 0;
  for (let k = 0; k < n; k++) {
    const j = perm[k];
    for (let p = colPtr[j]; p < colPtr[j + 1]; p++) {
      const pi = pinv[rowIdx[p]];
      if (pi >= k) {
        outRow[q] = pi;
        outVal[q++] = values[p];
      }
    }
    outPtr[k + 1] = q;
  }
  return { n, colPtr: outPtr, rowIdx: outRow, values: outVal };
}
