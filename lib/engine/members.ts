/**
 * Member preparation: geometry, the local stiffness as used in K (condensed for moment releases), the six global
 * DOFs of each member, and which nodes anything resists in rotation. Everything here follows from the model
 * alone, so a stored model prepares to the same members.
 */
import type { Model } from "./model";
import { DOFS_PER_NODE, globalDof } from "./dofs";
import { condense, frameLocalStiffness, memberFrame, releasedDofs, THETA_I, THETA_J, type MemberFrame } from "./elements";
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
