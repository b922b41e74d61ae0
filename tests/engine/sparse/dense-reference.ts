import type { SymmetricCsc } from "@/lib/engine/sparse";
import { SymmetricTripletBuilder } from "@/lib/engine/sparse";

/** Deterministic LCG (Numerical Recipes constants) so failures reproduce. */
export function createRandom(seed: number): () => number {
  let state = seed >>> 0;
  return () => {
    state = (Math.imul(state, 1664525) + 1013904223) >>> 0;
    return state / 4294967296;
  };
}

export function toDense(a: SymmetricCsc): number[][] {
  const dense = Array.from({ length: a.n }, () => new Array<number>(a.n).fill(0));
  for (let j = 0; j < a.n; j++) {
    for (let p = a.colPtr[j]; p < a.colPtr[j + 1]; p++) {
      const i = a.rowIdx[p];
      dense[i][j] += a.values[p];
      if (i !== j) dense[j][i] += a.values[p];
    }
  }
  return dense;
}

/** Dense Cholesky solve, the independent reference. */
export function solveDense(a: number[][], b: ArrayLike<number>): Float64Array {
  const n = a.length;
  const l = a.map((row) => row.slice());
  for (let j = 0; j < n; j++) {
    for (let k = 0; k < j; k++) l[j][j] -= l[j][k] * l[j][k];
    if (!(l[j][j] > 0)) throw new Error(`dense reference: matrix not SPD at ${j}`);
    l[j][j] = Math.sqrt(l[j][j]);
    for (let i = j + 1; i < n; i++) {
      for (let k = 0; k < j; k++) l[i][j] -= l[i][k] * l[j][k];
      l[i][j] /= l[j][j];
    }
  }
  const x = Float64Array.from(b);
  for (let i = 0; i < n; i++) {
    for (let k = 0; k < i; k++) x[i] -= l[i][k] * x[k];
    x[i] /= l[i][i];
  }
  for (let i = n - 1; i >= 0; i--) {
    for (let k = i + 1; k < n; k++) x[i] -= l[k][i] * x[k];
    x[i] /= l[i][i];
  }
  return x;
}

export function multiplyDense(a: number[][], x: ArrayLike<number>): Float64Array {
  return Float64Array.from(a, (row) => row.reduce((s, v, j) => s + v * x[j], 0));
}

export function norm(v: ArrayLike<number>): number {
  let s = 0;
  for (let i = 0; i < v.length; i++) s += v[i] * v[i];
  return Math.sqrt(s);
}

export function relativeError(x: ArrayLike<number>, ref: ArrayLike<number>): number {
  const diff = Float64Array.from(ref, (r, i) => x[i] - r);
  return norm(diff) / norm(ref);
}

/**
 * Random sparse SPD matrix: random symmetric off-diagonals, diagonal made strictly dominant.
 * With blockSize b the pattern couples whole b×b node blocks, as a frame model would.
 */
export function randomSpdMatrix(random: () => number, nodes: number, blockSize: number, density: number): SymmetricCsc {
  const n = nodes * blockSize;
  const builder = new SymmetricTripletBuilder(n);
  const rowSum = new Float64Array(n);
  for (let a = 0; a < nodes; a++) {
    for (let c = 0; c <= a; c++) {
      if (a !== c && random() > density) continue;
      for (let s = 0; s < blockSize; s++) {
        for (let t = 0; t < blockSize; t++) {
          const i = a * blockSize + s;
          const j = c * blockSize + t;
          if (i <= j) continue;
          const v = random() * 2 - 1;
          builder.add(i, j, v);
          rowSum[i] += Math.abs(v);
          rowSum[j] += Math.abs(v);
        }
      }
    }
  }
  for (let i = 0; i < n; i++) builder.add(i, i, rowSum[i] + 0.5 + random());
  return builder.toCsc();
}

/** Asserts the SymmetricCsc invariants; returns a description of the first violation or null. */
export function findCscViolation(a: SymmetricCsc): string | null {
  if (a.colPtr.length !== a.n + 1 || a.colPtr[0] !== 0) return "bad colPtr shape";
  if (a.rowIdx.length !== a.colPtr[a.n] || a.values.length !== a.colPtr[a.n]) return "array lengths";
  for (let j = 0; j < a.n; j++) {
    if (a.colPtr[j + 1] < a.colPtr[j]) return `colPtr decreasing at ${j}`;
    for (let p = a.colPtr[j]; p < a.colPtr[j + 1]; p++) {
      const i = a.rowIdx[p];
      if (i < j || i >= a.n) return `row ${i} outside lower triangle in column ${j}`;
      if (p > a.colPtr[j] && a.rowIdx[p - 1] >= i) return `rows not strictly ascending in column ${j}`;
    }
  }
  return null;
}
