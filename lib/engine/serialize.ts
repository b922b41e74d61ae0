/**
 * A result as plain JSON, keyed by node and member ids (for the CLI, storage and the browser). Diagram
 * extremes are included for every member; sampled diagrams only when asked for, since they dominate the size.
 * What is stored with a run is this JSON and the model; restoreResult (restore.ts) turns the two back into a
 * result that diagrams can be drawn from. `resultToCanonicalJson` is the byte-stable text of it.
 */
import type { AnalysisResult } from "./analysis-types";
import type { CaseResult } from "./results";
import type { VectorEnvelope } from "./combinations";
import { memberDiagram, memberEnvelope } from "./diagrams";
import { DOF_NAMES, DOFS_PER_NODE, globalDof } from "./dofs";

export interface SerializeOptions {
  /** Include sampled diagrams with this many uniform points per member (0 or omitted = extremes only). */
  readonly points?: number;
  /**
   * Without `points`: include each member's diagram extremes per case and per envelope (default true). A stored run
   * leaves them out (false): restoreResult rebuilds the result from the end forces, and memberDiagram and
   * memberEnvelope give the same extremes again from it.
   */
  readonly extremes?: boolean;
}

export type Json = null | boolean | number | string | Json[] | { [key: string]: Json };

export const FORCE_NAMES = ["fx", "fy", "mz"] as const;

function perNode(ids: ReadonlyArray<string>, v: ArrayLike<number>, names: ReadonlyArray<string>, keep?: ReadonlyArray<boolean>) {
  const out: Record<string, Record<string, number>> = {};
  ids.forEach((id, n) => {
    if (keep && !keep[n]) return;
    out[id] = Object.fromEntries(names.map((name, d) => [name, v[globalDof(n, d)]]));
  });
  return out;
}

function perMember(ids: ReadonlyArray<string>, v: ArrayLike<number>) {
  const out: Record<string, { start: Record<string, number>; end: Record<string, number> }> = {};
  ids.forEach((id, m) => {
    const o = 6 * m;
    out[id] = { start: { fx: v[o], fy: v[o + 1], mz: v[o + 2] }, end: { fx: v[o + 3], fy: v[o + 4], mz: v[o + 5] } };
  });
  return out;
}

/** Per node: has it reactions to report, i.e. is any of them non-zero in any result (fixed or spring DOFs)? */
function supportedNodes(result: AnalysisResult): boolean[] {
  const all = [...Object.values(result.loadCases), ...Object.values(result.combinations)];
  return result.nodeIds.map((_, n) => all.some((r) => DOF_NAMES.some((_, d) => r.reactions[globalDof(n, d)] !== 0)));
}

function caseToJson(result: AnalysisResult, r: CaseResult, supported: ReadonlyArray<boolean>, options: SerializeOptions): Json {
  const members: Record<string, Json> = {};
  const withDiagrams = Boolean(options.points) || options.extremes !== false;
  if (withDiagrams)
    for (const id of result.memberIds) {
      const d = memberDiagram(result, id, r.id, { points: options.points || 2 });
      members[id] = options.points
        ? ({ extremes: d.extremes, samples: d.samples } as unknown as Json)
        : (d.extremes as unknown as Json);
    }
  return {
    kind: r.kind,
    ...(r.kind === "combination" ? { factors: Object.fromEntries(r.sources.map((s) => [s.caseId, s.factor])) } : {}),
    displacements: perNode(result.nodeIds, r.displacements, DOF_NAMES),
    reactions: perNode(result.nodeIds, r.reactions, FORCE_NAMES, supported),
    endForces: perMember(result.memberIds, r.endForces),
    ...(withDiagrams ? { [options.points ? "diagrams" : "diagramExtremes"]: members } : {}),
    equilibrium: { ...r.equilibrium },
    relativeResidual: r.relativeResidual,
  };
}

function envelopeToJson(
  result: AnalysisResult,
  e: VectorEnvelope,
  of: ReadonlyArray<string>,
  kind: "node" | "member",
  names: ReadonlyArray<string>,
): Json {
  const ids = kind === "node" ? result.nodeIds : result.memberIds;
  const width = kind === "node" ? DOFS_PER_NODE : 6;
  const out: Record<string, Json> = {};
  ids.forEach((id, i) => {
    const entry: Record<string, Json> = {};
    names.forEach((name, d) => {
      const k = width * i + d;
      entry[name] = { max: e.max[k], maxFrom: of[e.maxFrom[k]], min: e.min[k], minFrom: of[e.minFrom[k]] };
    });
    out[id] = entry;
  });
  return out;
}

export const END_FORCE_NAMES = ["startFx", "startFy", "startMz", "endFx", "endFy", "endMz"] as const;

export function resultToJson(result: AnalysisResult, options: SerializeOptions = {}): Json {
  const supported = supportedNodes(result);
  const envelopes: Record<string, Json> = {};
  for (const [id, env] of Object.entries(result.envelopes)) {
    envelopes[id] = {
      of: [...env.of],
      displacements: envelopeToJson(result, env.displacements, env.of, "node", DOF_NAMES),
      reactions: envelopeToJson(result, env.reactions, env.of, "node", FORCE_NAMES),
      endForces: envelopeToJson(result, env.endForces, env.of, "member", END_FORCE_NAMES),
      ...(options.points || options.extremes !== false
        ? {
            diagramExtremes: Object.fromEntries(
              result.memberIds.map((m) => [m, memberEnvelope(result, m, id, { points: 2 }).extremes as unknown as Json]),
            ),
          }
        : {}),
    };
  }
  return {
    engineVersion: result.engineVersion,
    engineSourceHash: result.engineSourceHash,
    analysis: { ...result.analysis },
    stats: { ...result.stats },
    warnings: result.warnings.map((w) => ({ ...w })),
    loadCases: Object.fromEntries(Object.values(result.loadCases).map((r) => [r.id, caseToJson(result, r, supported, options)])),
    combinations: Object.fromEntries(
      Object.values(result.combinations).map((r) => [r.id, caseToJson(result, r, supported, options)]),
    ),
    envelopes,
  };
}

/**
 * JSON text with object keys sorted (by UTF-16 code units) and no white space: the same value always gives the
 * same bytes, whatever order its keys were inserted in. Numbers print as JSON.stringify prints them (the
 * shortest form that reads back to the same double; −0 prints as 0); typed arrays print as arrays.
 */
export function canonicalJson(value: unknown): string {
  if (value === null || typeof value !== "object") {
    const text = JSON.stringify(value);
    if (text === undefined) throw new Error(`canonicalJson: ${typeof value} has no JSON form`);
    return text;
  }
  if (ArrayBuffer.isView(value)) return canonicalJson(Array.from(value as unknown as ArrayLike<number>));
  if (Array.isArray(value)) return `[${value.map((v) => (v === undefined ? "null" : canonicalJson(v))).join(",")}]`;
  const entries = Object.entries(value as Record<string, unknown>).filter(([, v]) => v !== undefined);
  entries.sort(([a], [b]) => (a < b ? -1 : a > b ? 1 : 0));
  return `{${entries.map(([k, v]) => `${JSON.stringify(k)}:${canonicalJson(v)}`).join(",")}}`;
}

/** The canonical text of a result: byte-identical for the same model and engine, fit for storing and hashing. */
export function resultToCanonicalJson(result: AnalysisResult, options: SerializeOptions = {}): string {
  return canonicalJson(resultToJson(result, options));
}
