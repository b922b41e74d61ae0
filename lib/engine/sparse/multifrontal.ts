import type { CscMatrix } from "./csc";
import { subtractOuterProducts } from "./dense-kernels";
import type { SupernodalStructure } from "./supernodes";
import { scratch, type FactorWorkspace } from "./workspace";

/** Columns factorised together inside a front before the rest of the panel is updated with them. */
const PANEL_BLOCK = 8;

export type NumericOutcome = { ok: true; values: Float64Array } | { ok: false; position: number; pivot: number };

/**
 * Peak size of the stack of update (Schur complement) matrices: supernodes run in postorder, each pops its
 * children's matrices and pushes its own. Known up front, the stack is one array that never grows or copies.
 */
function peakUpdateStack(sn: SupernodalStructure): number {
  const { count, superStart, superParent, rowPtr } = sn;
  const pending = new Float64Array(count); // summed sizes of each supernode's children's update matrices
  let top = 0;
  let peak = 0;
  for (let s = 0; s < count; s++) {
    top -= pending[s];
    const mu = rowPtr[s + 1] - rowPtr[s] - (superStart[s + 1] - superStart[s]);
    const p = superParent[s];
    if (mu > 0 && p !== -1) {
      top += mu * mu;
      pending[p] += mu * mu;
      if (top > peak) peak = top;
    }
  }
  return peak;
}

/**
 * Multifrontal Cholesky LLᵀ (Duff & Reid 1983; Liu 1992). Supernodes are visited in postorder, so a
 * front's children left their update matrices on top of the stack. Each front is assembled from
 * C and the children's updates (extend-add), its pivot columns are factorised densely, and the
 * Schur complement is pushed for the parent. L is stored as one dense rows × columns block per supernode.
 *
 * The pivot of column k is tested before its square root: d ≤ tolerance · diag[k] (the original
 * diagonal, in the permuted order) is reported as a singular position, and nothing further is computed.
 */
export function factorMultifrontal(
  c: CscMatrix,
  sn: SupernodalStructure,
  diag: Float64Array,
  tolerance: number,
  workspace: FactorWorkspace | null = null,
): NumericOutcome {
  const { colPtr: cp, rowIdx: ci, values: cx } = c;
  const { count, superStart, superParent, rowPtr, rows, parentPos, valuePtr } = sn;
  // Each front (m × m, column-major) is built where supernode s's block of L begins: its first columns are
  // that block, so L needs no copy out of a separate front, and the trailing columns spill over storage of
  // later supernodes, which postorder has not written yet. L is sized for the furthest spill.
  let size = valuePtr[count];
  for (let s = 0; s < count; s++) {
    const m = rowPtr[s + 1] - rowPtr[s];
    size = Math.max(size, valuePtr[s] + m * m);
  }
  // Every entry of L is written before it is read, so reused storage needs no clearing.
  const lx = workspace ? workspace.floats("L", size) : new Float64Array(size);
  const stackData = scratch.floats("updates", peakUpdateStack(sn));
  const pos = new Int32Array(sn.n);
  // The stack's entries (owner supernode, offset), and how many of each supernode's children pushed one.
  const owners = new Int32Array(count);
  const offsets = new Int32Array(count);
  const pushed = new Int32Array(count);
  let depth = 0;
  let stackTop = 0;

  for (let s = 0; s < count; s++) {
    const first = superStart[s];
    const cols = superStart[s + 1] - first;
    const r0 = rowPtr[s];
    const m = rowPtr[s + 1] - r0;
    const fb = valuePtr[s];
    for (let r = 0; r < m; r++) pos[rows[r0 + r]] = r;
    // Zero the lower triangle in one JIT loop: a fill() call per column costs more in call overhead.
    for (let j = 0; j < m; j++) for (let q = fb + j * m + j; q < fb + j * m + m; q++) lx[q] = 0;

    // Assemble C's columns of this supernode.
    for (let j = 0; j < cols; j++) {
      const col = fb + j * m;
      for (let p = cp[first + j]; p < cp[first + j + 1]; p++) lx[col + pos[ci[p]]] += cx[p];
    }
    // Extend-add the children's update matrices: postorder puts them on top of the stack, in order.
    const nChildren = pushed[s];
    for (let q = depth - nChildren; q < depth; q++) {
      const child = owners[q];
      const offset = offsets[q];
      const cr0 = rowPtr[child] + superStart[child + 1] - superStart[child];
      const mu = rowPtr[child + 1] - cr0;
      for (let b = 0; b < mu; b++) {
        const col = fb + parentPos[cr0 + b] * m;
        const src = offset + b * mu;
        for (let a = b; a < mu; a++) lx[col + parentPos[cr0 + a]] += stackData[src + a];
      }
    }
    if (nChildren > 0) {
      depth -= nChildren;
      stackTop = offsets[depth];
    }

    // Factorise the pivot columns, left-looking by blocks so most work runs in the unrolled kernel (dense-kernels.ts).
    for (let k0 = 0; k0 < cols; k0 += PANEL_BLOCK) {
      const k1 = Math.min(cols, k0 + PANEL_BLOCK);
      subtractOuterProducts(lx, m, k0, k1, 0, k0, fb);
      for (let k = k0; k < k1; k++) {
        subtractOuterProducts(lx, m, k, k + 1, k0, k, fb);
        const kk = fb + k * m + k;
        const d = lx[kk];
        const akk = diag[first + k];
        // Written as !(a > b) so that NaN pivots are rejected too.
        if (!(akk > 0) || !(d > tolerance * akk)) return { ok: false, position: first + k, pivot: d };
        const lkk = Math.sqrt(d);
        lx[kk] = lkk;
        const inv = 1 / lkk;
        for (let i = kk + 1; i < fb + k * m + m; i++) lx[i] *= inv;
      }
    }

    // Schur complement for the parent.
    const mu = m - cols;
    if (mu > 0 && superParent[s] !== -1) {
      subtractOuterProducts(lx, m, cols, m, 0, cols, fb);
      const offset = stackTop;
      owners[depth] = s;
      offsets[depth++] = offset;
      stackTop += mu * mu;
      pushed[superParent[s]]++;
      const data = stackData;
      // Copy by loop: a subarray view per column would allocate in this hot path.
      for (let b = 0; b < mu; b++) {
        const src = fb + (cols + b) * m + cols;
        const dst = offset + b * mu;
        for (let a = b; a < mu; a++) data[dst + a] = lx[src + a];
      }
    }
  }
  return { ok: true, values: lx };
}
