/**
 * Whole-structure mechanisms, found from the supports before K is factored. A plane structure has three
 * rigid-body motions — slide in x, slide in y, turn — and if the supports allow one of them every node moves
 * with no member deforming, so K is singular whatever the members are. Saying that is more use to a person
 * than the pivot failure, which names whichever free node the ordering reached last.
 *
 * Supports act along global x and y (and about z), so an x restraint's reaction acts along the horizontal line
 * through its node and a y restraint's along the vertical line. Turning by ω about P moves a node at (x, y) by
 * ω·(−(y − Py), x − Px): an x restraint stops it unless y = Py, a y restraint unless x = Px, and a rotational
 * restraint always, where a member holds the node in rotation. So the structure can turn when nothing holds it
 * in rotation and all x restraints lie on one horizontal line and all y restraints on one vertical line: the
 * reactions are concurrent or parallel (common practice: improper supports of a rigid body).
 *
 * Only supports at nodes a member reaches count: a support at a loose node holds nothing of the structure.
 * A model that passes here can still be a local mechanism; the factorisation names that node (solve.ts).
 */
import type { Model } from "./model";
import type { PreparedMember } from "./members";
import { THETA_I, THETA_J } from "./elements";
import { rigidBodyError, type EngineError } from "./diagnostics";

/** Coordinates closer than this, relative to the model's extent, count as on one line. */
const SAME_LINE_TOLERANCE = 1e-12;

/** The x or y coordinates of a set of restraints, when they all share one value. */
function commonCoordinate(values: ReadonlyArray<number>, tolerance: number): number | null {
  if (values.length === 0) return null;
  const first = values[0];
  return values.every((v) => Math.abs(v - first) <= tolerance) ? first : null;
}

export function rigidBodyMotions(model: Model, members: ReadonlyArray<PreparedMember>): EngineError[] {
  if (members.length === 0) return [];
  const nodes = model.nodes;
  const reached = new Uint8Array(nodes.length);
  const heldInRotation = new Uint8Array(nodes.length);
  for (const p of members) {
    reached[p.start] = reached[p.end] = 1;
    if (!p.released.includes(THETA_I)) heldInRotation[p.start] = 1;
    if (!p.released.includes(THETA_J)) heldInRotation[p.end] = 1;
  }
  const xRestraintsAtY: number[] = [];
  const yRestraintsAtX: number[] = [];
  let rotationRestrained = false;
  let extent = 0;
  nodes.forEach((node, n) => {
    extent = Math.max(extent, Math.abs(node.x), Math.abs(node.y));
    const s = node.support;
    if (!reached[n] || !s) return;
    if (s.ux !== "free") xRestraintsAtY.push(node.y);
    if (s.uy !== "free") yRestraintsAtX.push(node.x);
    if (s.rz !== "free" && heldInRotation[n]) rotationRestrained = true;
  });
  const tolerance = SAME_LINE_TOLERANCE * (extent || 1);

  const errors: EngineError[] = [];
  if (xRestraintsAtY.length === 0) errors.push(rigidBodyError({ motion: "slide-x" }));
  if (yRestraintsAtX.length === 0) errors.push(rigidBodyError({ motion: "slide-y" }));
  if (rotationRestrained) return errors;
  const y = commonCoordinate(xRestraintsAtY, tolerance);
  const x = commonCoordinate(yRestraintsAtX, tolerance);
  const xLine = xRestraintsAtY.length === 0 || y !== null;
  const yLine = yRestraintsAtX.length === 0 || x !== null;
  if (!xLine || !yLine) return errors;
  if (x !== null && y !== null) {
    const at = nodes.find((node, n) => reached[n] && Math.abs(node.x - x) <= tolerance && Math.abs(node.y - y) <= tolerance);
    errors.push(rigidBodyError({ motion: "turn", about: { x, y }, ...(at ? { node: at.id } : {}) }));
  } else if (y !== null) errors.push(rigidBodyError({ motion: "turn", line: { y } }));
  else if (x !== null) errors.push(rigidBodyError({ motion: "turn", line: { x } }));
  else errors.push(rigidBodyError({ motion: "turn" }));
  return errors;
}
