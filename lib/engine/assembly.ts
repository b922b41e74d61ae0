/**
 * Assembly: member preparation (geometry, condensed local stiffness), the global stiffness K over the free
 * equations (assembled once per analysis), and the right-hand side of each load case:
 *   K11 D1 = P1 − FEF1 − K12 D2   (D2 = prescribed displacements of restrained DOFs).
 */
import type { Model } from "./model";
import { DOFS_PER_NODE, DofKind, dofLocation, globalDof, prescribedValue, type DofMap } from "./dofs";
import { condense, frameLocalStiffness, memberFrame, releasedDofs, THETA_I, THETA_J, toGlobalStiffness, type MemberFrame } from "./elements";
import { fixedEndForces, type CaseLoads } from "./loads";
import type { SymmetricCsc } from "./sparse";
import { patternPosition, stiffnessPattern } from "./stiffness-pattern";
import type { ValidModel } from "./validate";

export interface PreparedMember {
  readonly start: number;
  readonly end: number;
  readonly frame: MemberFrame;
  readonly E: number;
  readonly A: number;
  /**
   * I used for the element. A truss member without I gets a nominal 1: its moment DOFs are condensed out, so
   * its stiffness and fixed-end forces do not depend on I.
   */
  readonly I: number;
  /** Whether bending deflection along the member can be computed (I was given). */
  readonly hasBending: boolean;
  readonly released: ReadonlyArray<number>;
  /**
   * Condensed local stiffness of a member with releases; null without releases, where the plain frame matrix
   * is rebuilt on use (cheaper than keeping tens of thousands of small arrays alive).
   */
  readonly condensed: Float64Array | null;
}

/** The member's local stiffness as used in K (condensed for releases), written into `out`. */
export function localStiffness(p: PreparedMember, out: Float64Array): Float64Array {
  if (p.condensed) out.set(p.condensed);
  else frameLocalStiffness(p.E, p.A, p.I, p.frame.length, out);
  return out;
}

export function prepareMembers({ model, memberEnds }: Pick<ValidModel, "model" | "memberEnds">): PreparedMember[] {
  const members: PreparedMember[] = new Array(model.members.length);
  for (let i = 0; i < members.length; i++) {
    const m = model.members[i];
    const start = memberEnds[2 * i];
    const end = memberEnds[2 * i + 1];
    const a = model.nodes[start];
    const b = model.nodes[end];
    const frame = memberFrame(a.x, a.y, b.x, b.y);
    const I = m.I ?? 1;
    const released = releasedDofs(m.kind, m.releases?.startMoment ?? false, m.releases?.endMoment ?? false);
    const condensed = released.length > 0 ? condense(frameLocalStiffness(m.E, m.A, I, frame.length), null, released).k : null;
    members[i] = { start, end, frame, E: m.E, A: m.A, I, hasBending: m.I !== undefined, released, condensed };
  }
  return members;
}

/** The full (uncondensed) local stiffness of a prepared member. */
export function fullLocalStiffness(p: PreparedMember): Float64Array {
  return frameLocalStiffness(p.E, p.A, p.I, p.frame.length);
}

/** Per node: does any member end or rotational support resist its rotation? */
export function rotationalStiffness(model: Model, members: ReadonlyArray<PreparedMember>): boolean[] {
  const stiff = model.nodes.map((n) => (n.support?.rz ?? "free") !== "free");
  for (const p of members) {
    if (!p.released.includes(THETA_I)) stiff[p.start] = true;
    if (!p.released.includes(THETA_J)) stiff[p.end] = true;
  }
  return stiff;
}

/** Global DOF indices of a member's six DOFs. */
export function memberDofs(p: PreparedMember, out = new Int32Array(6)): Int32Array {
  for (let d = 0; d < DOFS_PER_NODE; d++) {
    out[d] = globalDof(p.start, d);
    out[DOFS_PER_NODE + d] = globalDof(p.end, d);
  }
  return out;
}

/**
 * K over the free equations, lower triangle in CSC. Values are added straight into the pattern of
 * `stiffnessPattern`; entries that no member or spring makes nonzero are then squeezed out, so the pattern
 * (and with it the ordering) is the same as adding only nonzero entries one by one.
 */
export function assembleStiffness(members: ReadonlyArray<PreparedMember>, dofs: DofMap): SymmetricCsc {
  const ends = new Int32Array(2 * members.length);
  for (let m = 0; m < members.length; m++) {
    ends[2 * m] = members[m].start;
    ends[2 * m + 1] = members[m].end;
  }
  const pat = stiffnessPattern(ends, dofs);
  const { colPtr, rowIdx } = pat;
  const values = new Float64Array(rowIdx.length);
  const touched = new Uint8Array(rowIdx.length);
  const k = new Float64Array(36);
  const K = new Float64Array(36);
  const g = new Int32Array(6);
  const eq = new Int32Array(6);
  const nodeOf = new Int32Array(6);
  for (let m = 0; m < members.length; m++) {
    const p = members[m];
    toGlobalStiffness(localStiffness(p, k), p.frame.c, p.frame.s, K);
    memberDofs(p, g);
    for (let a = 0; a < 6; a++) {
      eq[a] = dofs.equation[g[a]];
      nodeOf[a] = a < DOFS_PER_NODE ? p.start : p.end;
    }
    for (let a = 0; a < 6; a++) {
      if (eq[a] < 0) continue;
      for (let b = 0; b <= a; b++) {
        if (eq[b] < 0) continue;
        const v = K[a * 6 + b];
        if (v === 0) continue;
        const q = eq[a] >= eq[b] ? patternPosition(pat, m, nodeOf[a], eq[a], nodeOf[b], eq[b]) : patternPosition(pat, m, nodeOf[b], eq[b], nodeOf[a], eq[a]);
        values[q] += v;
        touched[q] = 1;
      }
    }
  }
  for (let e = 0; e < dofs.nFree; e++) {
    const s = dofs.spring[dofs.freeToGlobal[e]];
    // The first entry of each column is its diagonal.
    if (s !== 0) {
      values[colPtr[e]] += s;
      touched[colPtr[e]] = 1;
    }
  }
  // Squeeze out untouched entries in place; columns only move towards the front.
  let out = 0;
  let begin = 0; // the column's start before squeezing (colPtr[c] already holds the new one)
  for (let c = 0; c < pat.n; c++) {
    const end = colPtr[c + 1];
    for (let q = begin; q < end; q++) {
      if (!touched[q]) continue;
      rowIdx[out] = rowIdx[q];
      values[out++] = values[q];
    }
    colPtr[c + 1] = out;
    begin = end;
  }
  return { n: pat.n, colPtr, rowIdx: rowIdx.subarray(0, out), values: values.subarray(0, out) };
}

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

/** Prescribed displacements of one case, per global DOF (zeros elsewhere). */
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
