/**
 * The deformed shape of a model under one result (a load case or a combination), for drawing over the model.
 *
 * Each member's displaced curve comes from the engine's own member diagram: its `deflection` (local y) is the
 * Hermite cubic of the end displacements and rotations plus the exact particular solution of the member's span
 * loads, and its `axialDisplacement` (local x) the linear shape plus the axial particular solution. At a
 * released end (a hinge) the engine recovers the member's own end rotation by condensation, so a hinge shows as
 * a kink. Local (u, v) turn into global (ux, uy) with the member's direction cosines, so inclined members need
 * nothing of their own; truss members stay straight between their displaced ends.
 *
 * Coordinates here are the model's (m, y up); the drawing maps them with its own scale. The displacements are
 * magnified by one factor, chosen so the largest one is drawn about 8 % of the model's largest dimension and
 * rounded down to 1, 2 or 5 × 10ⁿ, and stated with the drawing.
 */
import { memberDiagram, type AnalysisResult, type ModelInput } from "@/lib/engine";
import { formatSignificant } from "./format";
import { resultUnit, type DisplayUnits } from "./display-units";

/** A point in the model's coordinates (m, y up); the drawing's Point has the same shape. */
interface Point {
  readonly x: number;
  readonly y: number;
}

/** A deformed shape's magnification: "× 200", "× 0.5", "× 2×10⁶". */
export const formatFactor = (factor: number) => `× ${formatSignificant(Number.isFinite(factor) ? factor : 0, 1)}`;

/** The largest displacement is drawn at most this fraction of the model's largest dimension. */
export const DEFORMED_FRACTION = 0.08;
/** Uniform sample points per member, to which the load discontinuities and the deflection's extremes are added. */
const POINTS_PER_MEMBER = 13;
/** Below this fraction of the model's size the displacements are numerical noise: no shape is drawn. */
const NEGLIGIBLE = 1e-12;

export interface DeformedMember {
  readonly id: string;
  /** Positions along the member, m from its start node, in order. */
  readonly x: ReadonlyArray<number>;
  /** Global displacement at each position, m, unmagnified. */
  readonly displacements: ReadonlyArray<{ readonly ux: number; readonly uy: number }>;
  /** The displaced positions in model coordinates (m, y up), displacements multiplied by `factor`. */
  readonly points: ReadonlyArray<Point>;
}

export interface LargestDisplacement {
  /** Magnitude of the global displacement, m. */
  readonly value: number;
  readonly node?: string;
  /** Inside a member: its id and the distance from its start node, m. */
  readonly member?: string;
  readonly x?: number;
}

export interface DeformedShape {
  readonly resultId: string;
  readonly kind: "load-case" | "combination";
  /** "load case D (Dead)", "combination ULS1". */
  readonly resultLabel: string;
  /** Drawn when some displacement is large enough to see; otherwise `members` is empty and `caption` says why. */
  readonly drawn: boolean;
  /** Displacements are drawn multiplied by this (1, 2 or 5 × 10ⁿ); 0 when nothing is drawn. */
  readonly factor: number;
  readonly members: ReadonlyArray<DeformedMember>;
  readonly largest?: LargestDisplacement;
  /** One sentence for the figure's caption and its accessible description. */
  readonly caption: string;
}

/** The largest of 1, 2 and 5 × 10ⁿ not above `raw` (> 0), so the magnified shape stays within its allowance. */
export function niceFactor(raw: number): number {
  if (!(raw > 0) || !Number.isFinite(raw)) return 1;
  let power = 10 ** Math.floor(Math.log10(raw));
  // log10 of an exact power of ten can land a hair below the integer.
  if (raw / power >= 10 * (1 - 1e-12)) power *= 10;
  const mantissa = raw / power;
  const step = mantissa >= 5 * (1 - 1e-12) ? 5 : mantissa >= 2 * (1 - 1e-12) ? 2 : 1;
  return Number((step * power).toPrecision(1));
}

/** A displacement or a length in the person's units: "4.07 mm", "0.160 in", "3.00 m", "9.84 ft". */
function shown(si: number, kind: "displacement" | "length", units: DisplayUnits, digits: number): string {
  const { unit, factor } = resultUnit(kind, units);
  return `${kind === "length" ? (si * factor).toFixed(digits) : formatSignificant(si * factor, digits)} ${unit}`;
}

function labelOf(model: ModelInput, id: string, kind: "load-case" | "combination"): string {
  const list = kind === "load-case" ? model.loadCases : model.combinations;
  const name = list?.find((c) => c.id === id)?.name;
  return `${kind === "load-case" ? "load case" : "combination"} ${id}${name && name !== id ? ` (${name})` : ""}`;
}

/** Where the largest displacement is, in words: "node B", "member m, 3.00 m from node A". */
export function describeLocation(l: LargestDisplacement, model: ModelInput, units: DisplayUnits = "si"): string {
  if (l.node !== undefined) return `node ${l.node}`;
  const start = model.members?.find((m) => m.id === l.member)?.start;
  return `member ${l.member}, ${shown(l.x ?? 0, "length", units, 2)} from ${start !== undefined ? `node ${start}` : "its start"}`;
}

/**
 * The deformed shape under `resultId` (a load case or combination of `result`, which was analysed or restored
 * from `model`). An envelope has no single shape: it and unknown ids give undefined. `units` only changes the caption.
 */
export function deformedShape(
  model: ModelInput,
  result: AnalysisResult,
  resultId: string,
  units: DisplayUnits = "si",
): DeformedShape | undefined {
  const r = result.loadCases[resultId] ?? result.combinations[resultId];
  if (!r) return undefined;
  const resultLabel = labelOf(model, resultId, r.kind);
  const nodes = new Map(model.nodes.map((n) => [n.id, n]));
  const nothing = (why: string): DeformedShape => ({
    resultId,
    kind: r.kind,
    resultLabel,
    drawn: false,
    factor: 0,
    members: [],
    caption: `No deformed shape drawn: ${why}.`,
  });

  // The nodes first, so a largest value at a member's end is named by its node.
  let largest: LargestDisplacement = { value: 0 };
  const nodeDisplacement = new Map<string, { ux: number; uy: number }>();
  result.nodeIds.forEach((id, i) => {
    const [ux, uy] = [r.displacements[3 * i], r.displacements[3 * i + 1]];
    nodeDisplacement.set(id, { ux, uy });
    const value = Math.hypot(ux, uy);
    if (value > largest.value) largest = { value, node: id };
  });

  const sampled: { id: string; from: Point; c: number; s: number; x: number[]; d: { ux: number; uy: number }[] }[] = [];
  for (const member of model.members ?? []) {
    const [a, z] = [nodes.get(member.start), nodes.get(member.end)];
    if (!a || !z || !result.memberIds.includes(member.id)) continue;
    const L = Math.hypot(z.x - a.x, z.y - a.y);
    if (!(L > 0)) continue;
    const [c, s] = [(z.x - a.x) / L, (z.y - a.y) / L];
    const diagram = memberDiagram(result, member.id, resultId, { points: POINTS_PER_MEMBER });
    const extremes = diagram.extremes.deflection;
    const xs = [...diagram.samples.x, extremes.max.x, extremes.min.x]
      .filter((x) => Number.isFinite(x))
      .map((x) => Math.min(Math.max(x, 0), L))
      .sort((p, q) => p - q)
      .filter((x, i, all) => i === 0 || x - all[i - 1] > 1e-9 * L);
    const d = xs.map((x) => {
      const { deflection: v, axialDisplacement: u } = diagram.valueAt(x);
      return { ux: u * c - v * s, uy: u * s + v * c };
    });
    // Ends are the nodes' own displacements (equal to rounding), so the member's curve meets its nodes.
    const [start, end] = [nodeDisplacement.get(member.start), nodeDisplacement.get(member.end)];
    if (start) d[0] = start;
    if (end && xs[xs.length - 1] >= L * (1 - 1e-9)) d[d.length - 1] = end;
    sampled.push({ id: member.id, from: { x: a.x, y: a.y }, c, s, x: xs, d });
    d.forEach((p, i) => {
      const value = Math.hypot(p.ux, p.uy);
      // Inside the member only where it beats every node by more than rounding.
      if (value > largest.value * (1 + 1e-9) && i > 0 && i < d.length - 1) largest = { value, member: member.id, x: xs[i] };
    });
  }

  const all = [...nodeDisplacement.values(), ...sampled.flatMap((m) => m.d)];
  if (all.some((p) => !Number.isFinite(p.ux) || !Number.isFinite(p.uy)))
    return nothing(`the displacements under ${resultLabel} are not finite numbers`);
  const xs = model.nodes.map((n) => n.x).filter(Number.isFinite);
  const ys = model.nodes.map((n) => n.y).filter(Number.isFinite);
  const span = xs.length ? Math.max(Math.max(...xs) - Math.min(...xs), Math.max(...ys) - Math.min(...ys)) : 0;
  const size = span > 0 ? span : 1;
  if (!(largest.value > NEGLIGIBLE * size)) return nothing(`nothing is displaced under ${resultLabel}`);

  const factor = niceFactor((DEFORMED_FRACTION * size) / largest.value);
  const members: DeformedMember[] = sampled.map((m) => ({
    id: m.id,
    x: m.x,
    displacements: m.d,
    points: m.x.map((x, i) => ({
      x: m.from.x + x * m.c + factor * m.d[i].ux,
      y: m.from.y + x * m.s + factor * m.d[i].uy,
    })),
  }));
  const where = describeLocation(largest, model, units);
  return {
    resultId,
    kind: r.kind,
    resultLabel,
    drawn: true,
    factor,
    members,
    largest,
    caption: `Deformed shape (dashed) under ${resultLabel}, displacements drawn ${formatFactor(factor)}; largest displacement ${shown(largest.value, "displacement", units, 3)} at ${where}.`,
  };
}
