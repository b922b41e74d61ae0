import type { SupernodalStructure } from "./supernodes";
import { scratch } from "./workspace";

// Triangular solves with the supernodal L for two right-hand sides at once. The part of each supernode below
// its diagonal block is a dense rectangle; it is applied four columns at a time, so each row of the work
// vectors is loaded and stored once per four columns and the eight partial sums are independent (the plain
// column-at-a-time loop is bound by one dependent add chain per case and runs several times slower).

/** L Lᵀ x = b for two right-hand sides already in the factor's (permuted) order, in place. */
export function solvePairInPlace(lx: Float64Array, sn: SupernodalStructure, x0: Float64Array, x1: Float64Array): void {
  const { count, superStart, rowPtr, rows, valuePtr, maxRows } = sn;
  // Rows below the diagonal block are gathered into / scattered from dense work vectors once per supernode.
  const w0 = scratch.floats("solve-w0", maxRows);
  const w1 = scratch.floats("solve-w1", maxRows);
  // Forward: L y = P b.
  for (let s = 0; s < count; s++) {
    const first = superStart[s];
    const cols = superStart[s + 1] - first;
    const r0 = rowPtr[s];
    const m = rowPtr[s + 1] - r0;
    const below = m - cols;
    const base = valuePtr[s];
    // Diagonal block: column by column (it is small; the rectangle below holds most entries).
    for (let k = 0; k < cols; k++) {
      const col = base + k * m;
      const d = lx[col + k];
      const a = (x0[first + k] /= d);
      const b = (x1[first + k] /= d);
      for (let i = k + 1; i < cols; i++) {
        const l = lx[col + i];
        x0[first + i] -= l * a;
        x1[first + i] -= l * b;
      }
    }
    if (below === 0) continue;
    w0.fill(0, 0, below);
    w1.fill(0, 0, below);
    let k = 0;
    for (; k + 3 < cols; k += 4) {
      const c0 = base + k * m + cols;
      const c1 = c0 + m;
      const c2 = c1 + m;
      const c3 = c2 + m;
      const a0 = x0[first + k],
        a1 = x0[first + k + 1],
        a2 = x0[first + k + 2],
        a3 = x0[first + k + 3];
      const b0 = x1[first + k],
        b1 = x1[first + k + 1],
        b2 = x1[first + k + 2],
        b3 = x1[first + k + 3];
      for (let i = 0; i < below; i++) {
        const l0 = lx[c0 + i],
          l1 = lx[c1 + i],
          l2 = lx[c2 + i],
          l3 = lx[c3 + i];
        w0[i] += l0 * a0 + l1 * a1 + l2 * a2 + l3 * a3;
        w1[i] += l0 * b0 + l1 * b1 + l2 * b2 + l3 * b3;
      }
    }
    for (; k < cols; k++) {
      const c = base + k * m + cols;
      const a = x0[first + k];
      const b = x1[first + k];
      for (let i = 0; i < below; i++) {
        const l = lx[c + i];
        w0[i] += l * a;
        w1[i] += l * b;
      }
    }
    for (let i = 0; i < below; i++) {
      const r = rows[r0 + cols + i];
      x0[r] -= w0[i];
      x1[r] -= w1[i];
    }
  }
  // Backward: Lᵀ z = y.
  for (let s = count - 1; s >= 0; s--) {
    const first = superStart[s];
    const cols = superStart[s + 1] - first;
    const r0 = rowPtr[s];
    const m = rowPtr[s + 1] - r0;
    const below = m - cols;
    const base = valuePtr[s];
    if (below > 0) {
      for (let i = 0; i < below; i++) {
        const r = rows[r0 + cols + i];
        w0[i] = x0[r];
        w1[i] = x1[r];
      }
      // The rectangle's dot products do not depend on the diagonal block's unknowns: take them first.
      let k = 0;
      for (; k + 3 < cols; k += 4) {
        const c0 = base + k * m + cols;
        const c1 = c0 + m;
        const c2 = c1 + m;
        const c3 = c2 + m;
        let a0 = 0,
          a1 = 0,
          a2 = 0,
          a3 = 0,
          b0 = 0,
          b1 = 0,
          b2 = 0,
          b3 = 0;
        for (let i = 0; i < below; i++) {
          const u = w0[i];
          const v = w1[i];
          const l0 = lx[c0 + i],
            l1 = lx[c1 + i],
            l2 = lx[c2 + i],
            l3 = lx[c3 + i];
          a0 += l0 * u;
          a1 += l1 * u;
          a2 += l2 * u;
          a3 += l3 * u;
          b0 += l0 * v;
          b1 += l1 * v;
          b2 += l2 * v;
          b3 += l3 * v;
        }
        x0[first + k] -= a0;
        x0[first + k + 1] -= a1;
        x0[first + k + 2] -= a2;
        x0[first + k + 3] -= a3;
        x1[first + k] -= b0;
        x1[first + k + 1] -= b1;
        x1[first + k + 2] -= b2;
        x1[first + k + 3] -= b3;
      }
      for (; k < cols; k++) {
        const c = base + k * m + cols;
        let a = 0;
        let b = 0;
        for (let i = 0; i < below; i++) {
          const l = lx[c + i];
          a += l * w0[i];
          b += l * w1[i];
        }
        x0[first + k] -= a;
        x1[first + k] -= b;
      }
    }
    for (let k = cols - 1; k >= 0; k--) {
      const col = base + k * m;
      let a = x0[first + k];
      let b = x1[first + k];
      for (let i = k + 1; i < cols; i++) {
        const l = lx[col + i];
        a -= l * x0[first + i];
        b -= l * x1[first + i];
      }
      const d = lx[col + k];
      x0[first + k] = a / d;
      x1[first + k] = b / d;
    }
  }
}
