/**
 * The default output of `npm run analyze`: a short report a person reads, in the units they asked for. Per
 * load case and combination: reactions at supported nodes, the extremes of N, V, M and deflection along each
 * member with where they occur, the equilibrium check and the solver's residual; then warnings. Everything
 * else (displacements, end forces, envelopes, sampled diagrams) is in the --json output.
 */
import {
  engineIdentityLabel,
  memberDiagram,
  type AnalysisResult,
  type CaseResult,
  type Extreme,
  type MemberDiagram,
  type Model,
} from "../../../lib/engine";
import { formatNumber, formatResidual, isNoise, NOISE_RATIO, SIGNIFICANT_FIGURES } from "./numbers";
import { inUnit, type Unit, type UnitSystem } from "./units";
import { formatTable } from "./table";

/** The engine flags a relative solver residual above this as ill-conditioned; the report uses it for both checks. */
const CHECK_LIMIT = 1e-6;

export interface ReportInput {
  readonly result: AnalysisResult;
  /** The model as analysed (supports, names, coordinates). */
  readonly model: Model;
  readonly units: UnitSystem;
  /** How the file was named on the command line. */
  readonly source: string;
  /** Notes on the input, such as numbers that look like mm or MPa (model-hints.ts). */
  readonly hints?: ReadonlyArray<string>;
}

type Extremes = MemberDiagram["extremes"];

/** The extreme of larger magnitude, keeping its sign. */
function largest(e: { max: Extreme; min: Extreme }): Extreme {
  return Math.abs(e.max.value) >= Math.abs(e.min.value) ? e.max : e.min;
}

interface Scales {
  readonly force: number;
  readonly moment: number;
  readonly deflection: number;
}

/** The largest value of each kind over every result, in SI: what counts as noise is relative to these. */
function scalesOf(model: Model, results: ReadonlyArray<CaseResult>, extremes: ReadonlyArray<ReadonlyArray<Extremes>>): Scales {
  let force = 0;
  let moment = 0;
  let deflection = 0;
  for (const r of results) {
    for (let i = 0; i < r.reactions.length; i += 3) {
      force = Math.max(force, Math.abs(r.reactions[i]), Math.abs(r.reactions[i + 1]));
      moment = Math.max(moment, Math.abs(r.reactions[i + 2]));
    }
  }
  for (const perMember of extremes) {
    for (const e of perMember) {
      force = Math.max(force, Math.abs(largest(e.N).value), Math.abs(largest(e.V).value));
      moment = Math.max(moment, Math.abs(largest(e.M).value));
      deflection = Math.max(deflection, Math.abs(largest(e.deflection).value));
    }
  }
  // A truss's moments are all noise; beside its forces times its size they show as what they are.
  let extent = 0;
  for (const n of model.nodes) extent = Math.max(extent, Math.abs(n.x), Math.abs(n.y));
  return { force, moment: Math.max(moment, force * extent), deflection };
}

function isSupported(node: Model["nodes"][number]): boolean {
  const s = node.support;
  return !!s && (s.ux !== "free" || s.uy !== "free" || s.rz !== "free");
}

function count(n: number, word: string): string {
  return `${n} ${word}${n === 1 ? "" : "s"}`;
}

function header(input: ReportInput, resultCount: number): string[] {
  const { result, units: u, source } = input;
  const s = result.stats;
  const identity = engineIdentityLabel({ version: result.engineVersion, sourceHash: result.engineSourceHash });
  const cases = count(Object.keys(result.loadCases).length, "load case");
  const combos = count(Object.keys(result.combinations).length, "combination");
  const deflection = u.deflection.name ? `${u.deflection.symbol} (${u.deflection.name})` : u.deflection.symbol;
  return [
    `${source}: linear elastic analysis, Gusset frame engine ${identity}`,
    `${count(s.nodes, "node")}, ${count(s.members, "member")}, ${count(s.equations, "equation")}; ${cases}, ${combos}${resultCount === 0 ? " (nothing to report)" : ""}`,
    "",
    `Units: forces ${u.force.symbol}, lengths ${u.length.symbol}, moments ${u.moment.symbol}, deflections ${deflection} (the model is read in N, m, Pa)`,
    ...(u.conversions ? [`  ${u.conversions}`] : []),
    "Signs: reactions are the forces the supports apply, along global x (right) and y (up), moments counter-clockwise;",
    "  N is positive in tension; M positive sagging (tension on the member's local -y face); deflection along local y.",
    "  N, V and deflection: the value of largest magnitude along the member, with its sign; M: the largest and smallest.",
    "Equilibrium: applied loads plus reactions, moments about the origin; it should be 0 to rounding.",
    `Numbers: ${SIGNIFICANT_FIGURES} significant figures; a value below ${NOISE_RATIO} of the largest of its kind is shown as 0.`,
  ];
}

function reactionRows(input: ReportInput, r: CaseResult, scales: Scales): string[] {
  const { model, units } = input;
  const rows: string[][] = [];
  model.nodes.forEach((node, n) => {
    if (!isSupported(node)) return;
    const s = node.support!;
    const cell = (d: 0 | 1 | 2, restrained: boolean) => {
      if (!restrained) return "-";
      const v = r.reactions[3 * n + d];
      return d === 2
        ? formatNumber(inUnit(v, units.moment), inUnit(scales.moment, units.moment))
        : formatNumber(inUnit(v, units.force), inUnit(scales.force, units.force));
    };
    rows.push([node.id, cell(0, s.ux !== "free"), cell(1, s.uy !== "free"), cell(2, s.rz !== "free")]);
  });
  if (rows.length === 0) return [];
  const f = units.force.symbol;
  return [
    "  Reactions (- where the support leaves the direction free)",
    ...formatTable(["node", `Fx (${f})`, `Fy (${f})`, `Mz (${units.moment.symbol})`], rows, "    "),
  ];
}

/** "-67.67 @ 4.000": the value and where along the member; no position for a zero or a constant diagram. */
function extremeCell(e: Extreme, other: Extreme, scale: number, unit: Unit, lengthUnit: Unit, length: number): string {
  const value = formatNumber(inUnit(e.value, unit), inUnit(scale, unit));
  if (isNoise(e.value, scale)) return value;
  if (isNoise(e.value - other.value, scale)) return `${value} all along`;
  return `${value} @ ${formatNumber(inUnit(e.x, lengthUnit), inUnit(length, lengthUnit))}`;
}

function memberRows(input: ReportInput, extremes: ReadonlyArray<Extremes>, scales: Scales): string[] {
  const { result, units } = input;
  const rows = result.memberIds.map((id, i) => {
    const e = extremes[i];
    const L = memberLength(input, i);
    /** The extreme of larger magnitude, with the other one to tell a constant diagram. */
    const signed = (q: { max: Extreme; min: Extreme }, scale: number, unit: Unit) => {
      const [big, small] = Math.abs(q.max.value) >= Math.abs(q.min.value) ? [q.max, q.min] : [q.min, q.max];
      return extremeCell(big, small, scale, unit, units.length, L);
    };
    return [
      id,
      signed(e.N, scales.force, units.force),
      signed(e.V, scales.force, units.force),
      extremeCell(e.M.max, e.M.min, scales.moment, units.moment, units.length, L),
      extremeCell(e.M.min, e.M.max, scales.moment, units.moment, units.length, L),
      signed(e.deflection, scales.deflection, units.deflection),
    ];
  });
  const f = units.force.symbol;
  const m = units.moment.symbol;
  return [
    `  Members (value @ distance from the member's start, ${units.length.symbol})`,
    ...formatTable(
      ["member", `N (${f})`, `V (${f})`, `M max (${m})`, `M min (${m})`, `deflection (${units.deflection.symbol})`],
      rows,
      "    ",
    ),
  ];
}

function memberLength(input: ReportInput, i: number): number {
  const { model } = input;
  const member = model.members[i];
  const a = model.nodes.find((n) => n.id === member.start)!;
  const b = model.nodes.find((n) => n.id === member.end)!;
  return Math.hypot(b.x - a.x, b.y - a.y);
}

function checkRows(input: ReportInput, r: CaseResult): string[] {
  const { units } = input;
  const q = r.equilibrium;
  const verdict = (v: number) => (v <= CHECK_LIMIT ? "OK" : `CHECK: above ${CHECK_LIMIT}`);
  return [
    `  Equilibrium: Fx ${formatResidual(inUnit(q.fx, units.force))} ${units.force.symbol}, ` +
      `Fy ${formatResidual(inUnit(q.fy, units.force))} ${units.force.symbol}, ` +
      `Mz ${formatResidual(inUnit(q.mz, units.moment))} ${units.moment.symbol}; relative ${formatResidual(q.relative)}: ${verdict(q.relative)}`,
    `  Solver relative residual |Ku - f| / |f|: ${formatResidual(r.relativeResidual)}: ${verdict(r.relativeResidual)}`,
  ];
}

function title(input: ReportInput, r: CaseResult): string {
  const { model } = input;
  if (r.kind === "load-case") {
    const name = model.loadCases.find((c) => c.id === r.id)?.name;
    return `Load case ${r.id}${name ? ` "${name}"` : ""}`;
  }
  const name = model.combinations.find((c) => c.id === r.id)?.name;
  const factors = r.sources.map((s) => `${s.factor} ${s.caseId}`).join(" + ");
  return `Combination ${r.id}${name ? ` "${name}"` : ""}: ${factors}`;
}

export function formatReport(input: ReportInput): string {
  const { result } = input;
  const results = [...Object.values(result.loadCases), ...Object.values(result.combinations)];
  const extremes = results.map((r) => result.memberIds.map((id) => memberDiagram(result, id, r.id, { points: 2 }).extremes));
  const scales = scalesOf(input.model, results, extremes);
  const lines = header(input, results.length);
  results.forEach((r, k) => {
    lines.push("", title(input, r), ...reactionRows(input, r, scales));
    if (result.memberIds.length > 0) lines.push(...memberRows(input, extremes[k], scales));
    lines.push(...checkRows(input, r));
  });
  const envelopes = Object.entries(result.envelopes);
  if (envelopes.length > 0) {
    const list = envelopes.map(([id, e]) => `${id} (of ${e.of.join(", ")})`).join("; ");
    lines.push("", `Envelopes ${list}: see --json.`);
  }
  const warnings = [...result.warnings.map((w) => w.message), ...(input.hints ?? [])];
  lines.push("", warnings.length === 0 ? "Warnings: none" : "Warnings:", ...warnings.map((w) => `  - ${w}`));
  lines.push("", "Full results (displacements, end forces, envelopes, diagrams, stresses): add --json.");
  return `${lines.join("\n")}\n`;
}
