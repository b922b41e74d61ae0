/**
 * Element matrices. Lowercase names are local (member axes), uppercase global.
 *
 * Local DOF order of a member: [u_i, v_i, θ_i, u_j, v_j, θ_j] (i = start node, j = end node); u along local
 * x, v along local y, θ counter-clockwise. Matrices are row-major Float64Array(36).
 *
 * The frame element is the bar (EA/L on u) overlaid with the Euler–Bernoulli beam on (v, θ):
 *   EI/L³ · [ 12   6L  −12   6L
 *              6L  4L²  −6L  2L²
 *            −12  −6L   12  −6L
 *              6L  2L²  −6L  4L² ]
 * A truss member is the frame element with both end moments released; its transverse stiffness then
 * condenses to zero, so truss and released frame members share one code path.
 */

/** Local indices of the end rotations (the DOFs a moment release frees). */
export const THETA_I = 2;
export const THETA_J = 5;

export interface MemberFrame {
  readonly length: number;
  /** Direction cosines of local x: (c, s) = ((xj − xi)/L, (yj − yi)/L). */
  readonly c: number;
  readonly s: number;
}

export function memberFrame(xi: number, yi: number, xj: number, yj: number): MemberFrame {
  const dx = xj - xi;
  const dy = yj - yi;
  const length = Math.hypot(dx, dy);
  return { length, c: dx / length, s: dy / length };
}

export function frameLocalStiffness(
  E: number,
  A: number,
  I: number,
  L: number,
  k: Float64Array = new Float64Array(36),
): Float64Array {
  const a = (E * A) / L;
  const b = (E * I) / (L * L * L);
  const b12 = 12 * b;
  const b6 = 6 * L * b;
  const b4 = 4 * L * L * b;
  const b2 = 2 * L * L * b;
  k.fill(0);
  k[0] = k[21] = a;
  k[3] = k[18] = -a;
  k[7] = k[28] = b12;
  k[10] = k[25] = -b12;
  k[8] = k[13] = k[11] = k[31] = b6;
  k[16] = k[26] = k[29] = k[34] = -b6;
  k[14] = k[35] = b4;
  k[17] = k[32] = b2;
  return k;
}

/** The released local DOFs of a member (subset of THETA_I, THETA_J). */
const RELEASE_SETS: ReadonlyArray<ReadonlyArray<number>> = [[], [THETA_I], [THETA_J], [THETA_I, THETA_J]];

export function releasedDofs(kind: "frame" | "truss", startMoment: boolean, endMoment: boolean): ReadonlyArray<number> {
  if (kind === "truss") return RELEASE_SETS[3];
  return RELEASE_SETS[(startMoment ? 1 : 0) + (endMoment ? 2 : 0)];
}

/** Inverse of the (1×1 or 2×2) released block k_rr. */
function invertReleasedBlock(k: Float64Array, r: ReadonlyArray<number>): number[][] {
  if (r.length === 1) return [[1 / k[r[0] * 6 + r[0]]]];
  const a = k[r[0] * 6 + r[0]];
  const b = k[r[0] * 6 + r[1]];
  const d = k[r[1] * 6 + r[1]];
  const det = a * d - b * b;
  return [
    [d / det, -b / det],
    [-b / det, a / det],
  ];
}

/**
 * Static condensation of the released DOFs r:  k* = k_cc − k_cr k_rr⁻¹ k_rc,  fef* = fef_c − k_cr k_rr⁻¹ fef_r.
 * The result keeps the 6×6 layout with zero rows and columns at r, so the released end carries no moment.
 */
export function condense(
  k: Float64Array,
  fef: Float64Array | null,
  r: ReadonlyArray<number>,
): { k: Float64Array; fef: Float64Array | null } {
  if (r.length === 0) return { k, fef };
  const inv = invertReleasedBlock(k, r);
  const kc = new Float64Array(36);
  const fc = fef ? new Float64Array(6) : null;
  for (let i = 0; i < 6; i++) {
    if (r.includes(i)) continue;
    // row i of k_cr · k_rr⁻¹
    const w = r.map((_, q) => r.reduce((sum, rp, p) => sum + k[i * 6 + rp] * inv[p][q], 0));
    for (let j = 0; j < 6; j++) {
      if (r.includes(j)) continue;
      kc[i * 6 + j] = k[i * 6 + j] - r.reduce((sum, rq, q) => sum + w[q] * k[rq * 6 + j], 0);
    }
    if (fef && fc) fc[i] = fef[i] - r.reduce((sum, rq, q) => sum + w[q] * fef[rq], 0);
  }
  if (r.length === 2) {
    // Hinged at both ends, a member has no transverse stiffness; set exactly what rounding leaves near zero.
    for (const i of [1, 4]) for (let j = 0; j < 6; j++) kc[i * 6 + j] = kc[j * 6 + i] = 0;
  }
  return { k: kc, fef: fc };
}

/**
 * Rotations at the released DOFs, from the kept ones: d_r = −k_rr⁻¹ (k_rc d_c + fef_r), with the full
 * (uncondensed) k and fef. Writes them into d in place.
 */
export function recoverReleased(k: Float64Array, fef: Float64Array | null, r: ReadonlyArray<number>, d: Float64Array): void {
  if (r.length === 0) return;
  const inv = invertReleasedBlock(k, r);
  const rhs = r.map((ri) => {
    let v = fef ? fef[ri] : 0;
    for (let j = 0; j < 6; j++) if (!r.includes(j)) v += k[ri * 6 + j] * d[j];
    return v;
  });
  r.forEach((ri, p) => {
    d[ri] = -(inv[p][0] * rhs[0] + (r.length > 1 ? inv[p][1] * rhs[1] : 0));
  });
}

/** Global → local for a 6-vector: per node [c s 0; −s c 0; 0 0 1]. */
export function toLocal(V: ArrayLike<number>, c: number, s: number, out = new Float64Array(6)): Float64Array {
  for (let n = 0; n < 6; n += 3) {
    const X = V[n];
    const Y = V[n + 1];
    out[n] = c * X + s * Y;
    out[n + 1] = -s * X + c * Y;
    out[n + 2] = V[n + 2];
  }
  return out;
}

/** Local → global for a 6-vector (the transpose of `toLocal`). */
export function toGlobal(v: ArrayLike<number>, c: number, s: number, out = new Float64Array(6), offset = 0): Float64Array {
  // `offset` reads a member's six values inside a long vector without a subarray view per member.
  for (let n = 0; n < 6; n += 3) {
    const x = v[offset + n];
    const y = v[offset + n + 1];
    out[n] = c * x - s * y;
    out[n + 1] = s * x + c * y;
    out[n + 2] = v[offset + n + 2];
  }
  return out;
}

const SCRATCH = new Float64Array(36);

/** K = Tᵀ k T, with T block-diagonal of the 3×3 node rotation. */
export function toGlobalStiffness(k: Float64Array, c: number, s: number, out = new Float64Array(36)): Float64Array {
  // R (3×3 per node block) applied as: (k T) then Tᵀ (k T); exploit that T only mixes the first two of each three.
  const kt = SCRATCH;
  for (let i = 0; i < 6; i++) {
    for (let n = 0; n < 6; n += 3) {
      const a = k[i * 6 + n];
      const b = k[i * 6 + n + 1];
      kt[i * 6 + n] = a * c - b * s;
      kt[i * 6 + n + 1] = a * s + b * c;
      kt[i * 6 + n + 2] = k[i * 6 + n + 2];
    }
  }
  for (let j = 0; j < 6; j++) {
    for (let n = 0; n < 6; n += 3) {
      const a = kt[n * 6 + j];
      const b = kt[(n + 1) * 6 + j];
      out[n * 6 + j] = c * a - s * b;
      out[(n + 1) * 6 + j] = s * a + c * b;
      out[(n + 2) * 6 + j] = kt[(n + 2) * 6 + j];
    }
  }
  return out;
}
