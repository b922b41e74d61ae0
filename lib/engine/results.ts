/**
 * Result recovery for one load case: full displacement vector, member end forces (local), reactions, and the
 * two checks carried by every result: the global equilibrium residual (applied loads + reactions) and the
 * relative solver residual ‖K u − f‖ / ‖f‖.
 *
 * Sign conventions:
 * - Displacements and reactions are global: ux, uy along X, Y; rz counter-clockwise. A reaction is the force
 *   the support applies to the structure.
 * - Member end forces are local, in the stiffness convention: [fx_i, fy_i, mz_i, fx_j, fy_j, mz_j] are the
 *   forces and moments the nodes apply to the member, along local x, y and counter-clockwise.
 */
import { DofKind, globalDof, type DofMap } from "./dofs";
import { localStiffness, memberDofs, type PreparedMember } from "./members";
import { toGlobal, toLocal } from "./elements";
import type { Model } from "./model";

export type ReadonlyVector = Readonly<Float64Array>;

export interface EquilibriumResidual {
  /** Σ applied + Σ reactions, global: should vanish. */
  readonly fx: number;
  readonly fy: number;
  /** About the global origin. */
  readonly mz: number;
  /** Largest component relative to the sum of magnitudes that produced it. */
  readonly relative: number;
}

export interface LoadSource {
  readonly caseIndex: number;
  readonly caseId: string;
  readonly factor: number;
}

export interface CaseResult {
  readonly id: string;
  readonly kind: "load-case" | "combination";
  /** The load cases and factors this result sums (a load case is itself with factor 1). */
  readonly sources: ReadonlyArray<LoadSource>;
  /** 3 per node in model order: ux, uy, rz. */
  readonly displacements: ReadonlyVector;
  /** 3 per node: fx, fy, mz; zero where the DOF is free. */
  readonly reactions: ReadonlyVector;
  /** 6 per member in model order, local, stiffness convention. */
  readonly endForces: ReadonlyVector;
  readonly equilibrium: EquilibriumResidual;
  readonly relativeResidual: number;
}

/** What a case contributes before recovery; kept so combinations can be summed linearly. */
export interface CaseVectors {
  /** Global applied loads at nodes: nodal loads plus the equivalent nodal loads (−FEF) of span loads. */
  readonly applied: Float64Array;
  /** Condensed fixed-end forces, local, 6 per member. */
  readonly fef: Float64Array;
  readonly rhs: Float64Array;
}

export function fullDisplacements(dofs: DofMap, u: Float64Array, D2: Float64Array | null): Float64Array {
  const D = D2 ? Float64Array.from(D2) : new Float64Array(dofs.kind.length);
  for (let e = 0; e < dofs.nFree; e++) D[dofs.freeToGlobal[e]] = u[e];
  return D;
}

/**
 * f = k d + fef per member (local), and reactions R = Σ F_member − P at supported DOFs (P = nodal loads only:
 * span loads are already inside F through fef), −k·u at springs.
 */
export function recoverForces(
  members: ReadonlyArray<PreparedMember>,
  dofs: DofMap,
  D: Float64Array,
  fef: Float64Array,
  nodal: Float64Array,
): { endForces: Float64Array; reactions: Float64Array } {
  const endForces = new Float64Array(6 * members.length);
  const memberSum = new Float64Array(D.length);
  const g = new Int32Array(6);
  const Dm = new Float64Array(6);
  const d = new Float64Array(6);
  const F = new Float64Array(6);
  const k = new Float64Array(36);
  members.forEach((p, m) => {
    localStiffness(p, k);
    memberDofs(p, g);
    for (let a = 0; a < 6; a++) Dm[a] = D[g[a]];
    toLocal(Dm, p.frame.c, p.frame.s, d);
    const o = 6 * m;
    for (let i = 0; i < 6; i++) {
      let v = fef[o + i];
      for (let j = 0; j < 6; j++) v += k[i * 6 + j] * d[j];
      endForces[o + i] = v;
    }
    toGlobal(endForces, p.frame.c, p.frame.s, F, o);
    for (let a = 0; a < 6; a++) memberSum[g[a]] += F[a];
  });
  const reactions = new Float64Array(D.length);
  for (let i = 0; i < D.length; i++) {
    const kind = dofs.kind[i];
    if (kind === DofKind.Spring) reactions[i] = -dofs.spring[i] * D[i];
    else if (kind !== DofKind.Free) reactions[i] = memberSum[i] - nodal[i];
  }
  return { endForces, reactions };
}

export function equilibriumResidual(model: Model, applied: ArrayLike<number>, reactions: ArrayLike<number>): EquilibriumResidual {
  let fx = 0;
  let fy = 0;
  let mz = 0;
  let scaleF = 0;
  let scaleM = 0;
  const nodes = model.nodes;
  for (let n = 0; n < nodes.length; n++) {
    const { x, y } = nodes[n];
    const o = globalDof(n, 0);
    // Applied loads and reactions are summed the same way: each is a force system acting on the structure.
    for (let pass = 0; pass < 2; pass++) {
      const v = pass === 0 ? applied : reactions;
      const X = v[o];
      const Y = v[o + 1];
      const M = v[o + 2];
      fx += X;
      fy += Y;
      mz += x * Y - y * X + M;
      scaleF += Math.abs(X) + Math.abs(Y);
      scaleM += Math.abs(x * Y) + Math.abs(y * X) + Math.abs(M);
    }
  }
  const rf = scaleF > 0 ? Math.max(Math.abs(fx), Math.abs(fy)) / scaleF : 0;
  const rm = scaleM > 0 ? Math.abs(mz) / scaleM : 0;
  return { fx, fy, mz, relative: Math.max(rf, rm) };
}

/** Σ factor · vector. */
export function linearCombination(
  vectors: ReadonlyArray<ArrayLike<number>>,
  factors: ReadonlyArray<number>,
  length: number,
): Float64Array {
  const out = new Float64Array(length);
  vectors.forEach((v, c) => {
    const f = factors[c];
    if (f === 0) return;
    for (let i = 0; i < length; i++) out[i] += f * v[i];
  });
  return out;
}
