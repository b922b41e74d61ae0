/**
 * Results along a member, computed on demand: axial force N, shear V, bending moment M, transverse and axial
 * displacement, and extreme-fibre stresses, at any x from the start node, with exact extremes.
 *
 * Sign conventions (internal forces at a section, acting on the part [0, x] from the part beyond):
 * - N > 0 in tension.
 * - M > 0 sagging: tension on the −y (local) side — the bottom of a beam drawn left to right.
 * - V = dM/dx; for a simply supported beam under downward load V is positive near the start node.
 * - Deflection v(x) is the displacement along local y (+y positive), including rigid-body motion;
 *   `relativeDeflection` is measured from the chord between the displaced ends (for span/deflection limits).
 * - Stresses are N/A ∓ M·c/I, tension positive: top (+y side) = N/A − M·cTop/I, bottom = N/A + M·cBottom/I.
 *
 * From the end forces f (local, stiffness convention) and the span loads, statics gives
 *   N(x) = −f_xi − ∫₀ˣ p,   V(x) = f_yi + ∫₀ˣ q (+ point loads),   M(x) = −m_i + ∫₀ˣ V (− couples).
 * The displacements are the cubic (Hermite) shape functions of the end displacements plus the exact particular
 * solution of the span loads on the member clamped at both ends: EI v_p'' = M_p, v_p = v_p' = 0 at x = 0.
 */
import type { AnalysisResult } from "./analysis-types";
import { contextOf, type AnalysisContext } from "./context";
import { resultFor } from "./access";
import { fullLocalStiffness, memberDofs, type PreparedMember } from "./members";
import { recoverReleased, toLocal } from "./elements";
import { fixedEndForces, type SpanLoads } from "./loads";
import {
  combine,
  evaluate,
  extrema,
  fromGlobalPolynomial,
  integrate,
  zeroPiecewise,
  type Extreme,
  type Piecewise,
} from "./piecewise";

export const DIAGRAM_QUANTITIES = [
  "N",
  "V",
  "M",
  "deflection",
  "relativeDeflection",
  "axialDisplacement",
  "stressTop",
  "stressBottom",
] as const;
export type DiagramQuantity = (typeof DIAGRAM_QUANTITIES)[number];
/** Always present; the others need I (relative deflection) and cTop / cBottom (stresses). */
type AlwaysPresent = "N" | "V" | "M" | "deflection" | "axialDisplacement";
type PerQuantity<T> = Record<AlwaysPresent, T> & Partial<Record<Exclude<DiagramQuantity, AlwaysPresent>, T>>;
export type DiagramValues = PerQuantity<number>;
export interface SectionForces {
  readonly N: number;
  readonly V: number;
  readonly M: number;
}
export interface MinMax {
  readonly max: Extreme;
  readonly min: Extreme;
}

export interface MemberDiagram {
  readonly memberId: string;
  readonly resultId: string;
  readonly length: number;
  /** Quantities available for this member (stresses need cTop/cBottom and I; deflection needs I). */
  readonly quantities: ReadonlyArray<DiagramQuantity>;
  /** Values at x (m from the start node); at a point load or couple, the value just beyond it. */
  valueAt(x: number, side?: "left" | "right"): DiagramValues;
  /** Max and min of each quantity over the member, with where they occur. */
  readonly extremes: Readonly<PerQuantity<MinMax>>;
  /** Sampled positions (uniform points plus both sides of every load discontinuity) and values. */
  readonly samples: { readonly x: ReadonlyArray<number> } & Readonly<PerQuantity<ReadonlyArray<number>>>;
}

/** The span loads of a result (a case, or the scaled union of a combination's cases). */
function memberLoads(ctx: AnalysisContext, sources: ReadonlyArray<{ caseIndex: number; factor: number }>, m: number): SpanLoads {
  const out: SpanLoads = { distributed: [], concentrated: [] };
  for (const { caseIndex, factor } of sources) {
    const s = ctx.caseLoads[caseIndex].span.get(m);
    if (!s || factor === 0) continue;
    for (const d of s.distributed) out.distributed.push({ ...d, wa: d.wa * factor, wb: d.wb * factor });
    for (const c of s.concentrated) out.concentrated.push({ ...c, value: c.value * factor });
  }
  return out;
}

function breaksOf(loads: SpanLoads, L: number): Float64Array {
  const xs = [0, L];
  for (const d of loads.distributed) xs.push(d.a, d.b);
  for (const c of loads.concentrated) xs.push(c.a);
  xs.sort((a, b) => a - b);
  const out: number[] = [];
  for (const x of xs) {
    const v = Math.min(Math.max(x, 0), L);
    if (out.length === 0 || v - out[out.length - 1] > 1e-12 * L) out.push(v);
  }
  out[out.length - 1] = L;
  return Float64Array.from(out);
}

/** Load intensity per segment (axis 0 = p, 1 = q) and steps at breaks (axis 0/1 forces, 2 couples). */
function loadPieces(loads: SpanLoads, breaks: Float64Array) {
  const intensity = [zeroPiecewise(breaks), zeroPiecewise(breaks)];
  const steps = [0, 1, 2].map(() => new Float64Array(breaks.length - 1));
  for (const d of loads.distributed) {
    const slope = (d.wb - d.wa) / (d.b - d.a);
    for (let k = 0; k < breaks.length - 1; k++) {
      const mid = (breaks[k] + breaks[k + 1]) / 2;
      if (mid < d.a || mid > d.b) continue;
      const c = intensity[d.axis].coeffs[k];
      c[0] += d.wa + slope * (breaks[k] - d.a);
      c[1] += slope;
    }
  }
  for (const c of loads.concentrated) {
    // A load exactly at the end node belongs to that node's end force, not to a step inside the span.
    if (c.a >= breaks[breaks.length - 1] - 1e-12 * breaks[breaks.length - 1]) continue;
    let k = 0;
    while (k + 1 < breaks.length - 1 && breaks[k + 1] <= c.a + 1e-12 * breaks[breaks.length - 1]) k++;
    steps[c.axis][k] += c.value;
  }
  return { intensity, steps };
}

interface Statics {
  N: Piecewise;
  V: Piecewise;
  M: Piecewise;
}

/** N, V, M from start-end forces (fx_i, fy_i, mz_i) and the loads. */
function statics(f0: number, f1: number, f2: number, pieces: ReturnType<typeof loadPieces>, breaks: Float64Array): Statics {
  const negSteps = pieces.steps[2].map((v) => -v);
  const V = integrate(pieces.intensity[1], f1, pieces.steps[1]);
  const M = integrate(V, -f2, negSteps);
  const N = combine([[integrate(pieces.intensity[0], f0, pieces.steps[0]), -1]], breaks);
  return { N, V, M };
}

/** The member's span loads under a result and N, V, M along it, from statics alone. */
function buildStatics(ctx: AnalysisContext, result: AnalysisResult, memberId: string, resultId: string, caller: string) {
  const m = ctx.memberIndex.get(memberId);
  if (m === undefined) throw new Error(`${caller}: no member "${memberId}"`);
  const p: PreparedMember = ctx.members[m];
  const r = resultFor(result, resultId);
  const L = p.frame.length;
  const loads = memberLoads(ctx, r.sources, m);
  const breaks = breaksOf(loads, L);
  const pieces = loadPieces(loads, breaks);
  const f = r.endForces.subarray(6 * m, 6 * m + 6);
  return { m, p, r, L, loads, breaks, pieces, ...statics(f[0], f[1], f[2], pieces, breaks) };
}

function buildDiagram(ctx: AnalysisContext, result: AnalysisResult, memberId: string, resultId: string) {
  const { m, p, r, L, loads, breaks, pieces, N, V, M } = buildStatics(ctx, result, memberId, resultId, "memberDiagram");

  // End displacements in local axes, with the rotations of released ends recovered by condensation.
  const g = memberDofs(p);
  const d = toLocal(
    Array.from(g, (gi) => r.displacements[gi]),
    p.frame.c,
    p.frame.s,
  );
  const fefFull = fixedEndForces(loads, L);
  if (p.hasBending) recoverReleased(fullLocalStiffness(p), fefFull, p.released, d);

  // Axial: linear shape functions plus the particular solution EA u_p' = N_p, u_p(0) = 0 (N_p from the fixed-end forces).
  const Np = statics(fefFull[0], 0, 0, pieces, breaks).N;
  const up = integrate(combine([[Np, 1 / (p.E * p.A)]], breaks), 0);
  const u = combine(
    [
      [fromGlobalPolynomial([d[0], (d[3] - d[0]) / L], breaks), 1],
      [up, 1],
    ],
    breaks,
  );
  const chord = fromGlobalPolynomial([d[1], (d[4] - d[1]) / L], breaks);
  let v = chord;
  if (p.hasBending) {
    const EI = p.E * p.I;
    // Hermite cubics: v = N1 v_i + N2 θ_i + N3 v_j + N4 θ_j, written out as one polynomial in x.
    const hermite = [
      d[1],
      d[2],
      (3 * (d[4] - d[1])) / L ** 2 - (2 * d[2] + d[5]) / L,
      (2 * (d[1] - d[4])) / L ** 3 + (d[2] + d[5]) / L ** 2,
    ];
    // Particular solution: EI v_p'' = M_p with v_p = v_p' = 0 at x = 0; the fixed-end forces make them vanish at L too.
    const Mp = statics(0, fefFull[1], fefFull[2], pieces, breaks).M;
    const vp = integrate(integrate(combine([[Mp, 1 / EI]], breaks), 0), 0);
    v = combine(
      [
        [fromGlobalPolynomial(hermite, breaks), 1],
        [vp, 1],
      ],
      breaks,
    );
  }
  const pieceByQuantity: Partial<Record<DiagramQuantity, Piecewise>> = { N, V, M, axialDisplacement: u };
  if (p.hasBending) {
    pieceByQuantity.deflection = v;
    pieceByQuantity.relativeDeflection = combine(
      [
        [v, 1],
        [chord, -1],
      ],
      breaks,
    );
    const member = ctx.model.members[m];
    if (member.cTop !== undefined)
      pieceByQuantity.stressTop = combine(
        [
          [N, 1 / p.A],
          [M, -member.cTop / p.I],
        ],
        breaks,
      );
    if (member.cBottom !== undefined)
      pieceByQuantity.stressBottom = combine(
        [
          [N, 1 / p.A],
          [M, member.cBottom / p.I],
        ],
        breaks,
      );
  } else pieceByQuantity.deflection = chord;
  return { L, breaks, pieceByQuantity };
}

export interface DiagramOptions {
  /** Uniformly spaced sample points (≥ 2), to which both sides of every load discontinuity are added. Default 21. */
  readonly points?: number;
}

export function memberDiagram(
  result: AnalysisResult,
  memberId: string,
  caseOrCombo: string,
  options: DiagramOptions = {},
): MemberDiagram {
  const { L, breaks, pieceByQuantity } = buildDiagram(contextOf(result), result, memberId, caseOrCombo);
  const quantities = DIAGRAM_QUANTITIES.filter((q) => pieceByQuantity[q] !== undefined);
  const valueAt = (x: number, side: "left" | "right" = "right"): DiagramValues => {
    const xc = Math.min(Math.max(x, 0), L);
    return Object.fromEntries(quantities.map((q) => [q, evaluate(pieceByQuantity[q]!, xc, side)])) as DiagramValues;
  };
  const extremes = Object.fromEntries(quantities.map((q) => [q, extrema(pieceByQuantity[q]!)])) as PerQuantity<MinMax>;
  const xs = samplePositions(L, breaks, options.points ?? 21);
  const sampled: Partial<Record<DiagramQuantity, number[]>> = {};
  for (const q of quantities) sampled[q] = xs.map((s) => evaluate(pieceByQuantity[q]!, s.x, s.side));
  const samples = { x: xs.map((s) => s.x), ...sampled } as MemberDiagram["samples"];
  return Object.freeze({ memberId, resultId: caseOrCombo, length: L, quantities, valueAt, extremes, samples });
}

/** N, V and M along a member: what a design check at each section reads, without the displacements. */
export interface MemberForces {
  readonly memberId: string;
  readonly resultId: string;
  readonly length: number;
  /** N, V and M at x (m from the start node); at a point load or couple, the value just beyond it. */
  forcesAt(x: number, side?: "left" | "right"): SectionForces;
  /** Max and min of N, V and M over the member, with where they occur. */
  readonly extremes: Readonly<Record<"N" | "V" | "M", MinMax>>;
  /** The same sampled positions as the member's diagram, and N, V, M there. */
  readonly samples: { readonly x: ReadonlyArray<number> } & Readonly<Record<"N" | "V" | "M", ReadonlyArray<number>>>;
}

/**
 * The section forces of `memberDiagram` alone: the same statics, samples and exact extremes, without the
 * end displacements, the condensation of released ends and the particular solutions the deflections need.
 * A check over every section of every member of a large frame under every combination builds thousands.
 */
export function memberForces(
  result: AnalysisResult,
  memberId: string,
  caseOrCombo: string,
  options: DiagramOptions = {},
): MemberForces {
  const { L, breaks, N, V, M } = buildStatics(contextOf(result), result, memberId, caseOrCombo, "memberForces");
  const forcesAt = (x: number, side: "left" | "right" = "right"): SectionForces => {
    const xc = Math.min(Math.max(x, 0), L);
    return { N: evaluate(N, xc, side), V: evaluate(V, xc, side), M: evaluate(M, xc, side) };
  };
  const xs = samplePositions(L, breaks, options.points ?? 21);
  const sample = (pp: Piecewise) => xs.map((s) => evaluate(pp, s.x, s.side));
  return Object.freeze({
    memberId,
    resultId: caseOrCombo,
    length: L,
    forcesAt,
    extremes: { N: extrema(N), V: extrema(V), M: extrema(M) },
    samples: { x: xs.map((s) => s.x), N: sample(N), V: sample(V), M: sample(M) },
  });
}

export function samplePositions(L: number, breaks: Float64Array, points: number): { x: number; side: "left" | "right" }[] {
  const n = Math.max(2, Math.floor(points));
  const out: { x: number; side: "left" | "right" }[] = [];
  for (let i = 0; i < n; i++) out.push({ x: (L * i) / (n - 1), side: i === n - 1 ? "left" : "right" });
  // With no load discontinuity inside the span (most members), the uniform points are already in order.
  if (breaks.length <= 2) return out;
  for (let k = 1; k < breaks.length - 1; k++) out.push({ x: breaks[k], side: "left" }, { x: breaks[k], side: "right" });
  // Left before right at the same x, so a plotted step is vertical.
  return out.sort((a, b) => a.x - b.x || (a.side === "left" ? -1 : 1));
}

export interface MemberEnvelope {
  readonly memberId: string;
  /** The load cases / combinations enveloped. */
  readonly of: ReadonlyArray<string>;
  readonly x: ReadonlyArray<number>;
  readonly max: Readonly<Partial<Record<DiagramQuantity, ReadonlyArray<number>>>>;
  readonly min: Readonly<Partial<Record<DiagramQuantity, ReadonlyArray<number>>>>;
  /** Exact extremes over all the results, with the result that produces each. */
  readonly extremes: Readonly<
    Partial<
      Record<
        DiagramQuantity,
        { readonly max: Extreme & { readonly from: string }; readonly min: Extreme & { readonly from: string } }
      >
    >
  >;
}

/**
 * Max and min of every diagram quantity along a member over several results, given by their ids or by the id
 * of an envelope defined in the model.
 */
export function memberEnvelope(
  result: AnalysisResult,
  memberId: string,
  of: string | ReadonlyArray<string>,
  options: DiagramOptions = {},
): MemberEnvelope {
  const ids = typeof of === "string" ? (result.envelopes[of]?.of ?? [of]) : of;
  const ctx = contextOf(result);
  const built = ids.map((id) => buildDiagram(ctx, result, memberId, id));
  const L = built[0].L;
  const allBreaks = Float64Array.from(new Set(built.flatMap((b) => Array.from(b.breaks)))).sort();
  const positions = samplePositions(L, allBreaks, options.points ?? 21);
  const quantities = DIAGRAM_QUANTITIES.filter((q) => built.every((b) => b.pieceByQuantity[q] !== undefined));
  const max: Partial<Record<DiagramQuantity, number[]>> = {};
  const min: Partial<Record<DiagramQuantity, number[]>> = {};
  const extremes: Partial<Record<DiagramQuantity, { max: Extreme & { from: string }; min: Extreme & { from: string } }>> = {};
  for (const q of quantities) {
    const values = built.map((b) => positions.map((p) => evaluate(b.pieceByQuantity[q]!, p.x, p.side)));
    max[q] = positions.map((_, i) => Math.max(...values.map((v) => v[i])));
    min[q] = positions.map((_, i) => Math.min(...values.map((v) => v[i])));
    built.forEach((b, r) => {
      const e = extrema(b.pieceByQuantity[q]!);
      const cur = extremes[q];
      if (!cur || e.max.value > cur.max.value)
        extremes[q] = { max: { ...e.max, from: ids[r] }, min: cur?.min ?? { ...e.min, from: ids[r] } };
      if (e.min.value < extremes[q]!.min.value) extremes[q] = { ...extremes[q]!, min: { ...e.min, from: ids[r] } };
    });
  }
  return Object.freeze({ memberId, of: ids, x: positions.map((p) => p.x), max, min, extremes });
}
