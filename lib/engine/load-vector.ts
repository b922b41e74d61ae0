/**
 * Load vectors of one load case: the members' fixed-end forces (condensed for releases), the global applied
 * nodal loads P − Σ FEF, the prescribed displacements D2, and the right-hand side over the free equations:
 *   K11 D1 = P1 − FEF1 − K12 D2   (D2 = prescribed displacements of restrained DOFs).
 */
import type { Model } from "./model";
import { DofKind, dofLocation, prescribedValue, type DofMap } from "./dofs";
import { condense, toGlobal, toGlobalStiffness } from "./elements";
import { fixedEndForces, type CaseLoads } from "./loads";
import { fullLocalStiffness, localStiffness, memberDofs, type PreparedMember } from "./members";

/** Fixed-end forces of one case, condensed for releases, local, 6 per member (zeros where unloaded). */
export function caseFixedEndForces(members: ReadonlyArray<PreparedMember>, loads: CaseLoads): Float64Array {
  const fef = new Float64Array(6 * members.length);
  for (const m of loads.span.keys()) {
    const span = loads.span.get(m)!;
    const p = members[m];
    let f = fixedEndForces(span, p.frame.length);
    if (p.released.length > 0) f = condense(fullLocalStiffness(p), f, p.released).fef!;
    fef.set(f, 6 * m);
  }
  return fef;
}

/** Prescribed displacements of one case, per global DOF (zeros elsewhere); null when there are none. */
export function casePrescribed(model: Model, dofs: DofMap, caseId: string): Float64Array | null {
  let D2: Float64Array | null = null;
  for (let g = 0; g < dofs.kind.length; g++) {
    if (dofs.kind[g] !== DofKind.Prescribed) continue;
    const { node, direction } = dofLocation(g);
    const v = prescribedValue(model, node, direction, caseId);
    if (v !== 0) (D2 ??= new Float64Array(dofs.kind.length))[g] = v;
  }
  return D2;
}

/** Global applied nodal loads: P − Σ FEF (the span loads' statically equivalent nodal loads). */
export function appliedNodalLoads(members: ReadonlyArray<PreparedMember>, loads: CaseLoads, fef: Float64Array): Float64Array {
  const applied = Float64Array.from(loads.nodal);
  const g = new Int32Array(6);
  const F = new Float64Array(6);
  for (const m of loads.span.keys()) {
    const p = members[m];
    toGlobal(fef, p.frame.c, p.frame.s, F, 6 * m);
    memberDofs(p, g);
    for (let a = 0; a < 6; a++) applied[g[a]] -= F[a];
  }
  return applied;
}

/**
 * Right-hand side over the free equations: P1 − FEF1 − K12 D2, where `applied` (P − FEF, global, from
 * `appliedNodalLoads`) already holds the first two terms.
 */
export function caseRhs(
  members: ReadonlyArray<PreparedMember>,
  dofs: DofMap,
  applied: Float64Array,
  D2: Float64Array | null,
): Float64Array {
  const f = new Float64Array(dofs.nFree);
  for (let e = 0; e < dofs.nFree; e++) f[e] = applied[dofs.freeToGlobal[e]];
  if (D2) {
    const g = new Int32Array(6);
    const k = new Float64Array(36);
    const K = new Float64Array(36);
    for (const p of members) {
      memberDofs(p, g);
      if (!g.some((gb) => D2[gb] !== 0)) continue;
      toGlobalStiffness(localStiffness(p, k), p.frame.c, p.frame.s, K);
      for (let a = 0; a < 6; a++) {
        const e = dofs.equation[g[a]];
        if (e < 0) continue;
        for (let b = 0; b < 6; b++) if (D2[g[b]] !== 0) f[e] -= K[a * 6 + b] * D2[g[b]];
      }
    }
  }
  return f;
}
