/**
 * A result as plain JSON, keyed by node and member ids (for the CLI, storage and the browser). Diagram
 * extremes are included for every member; sampled diagrams only when asked for, since they dominate the size.
 */
import type { AnalysisResult } from "./analysis-types";
import type { CaseResult } from "./results";
import type { VectorEnvelope } from "./combinations";
import { memberDiagram, memberEnvelope } from "./diagrams";
import { DOF_NAMES, DOFS_PER_NODE, globalDof } from "./dofs";

export interface SerializeOptions {
  /** Include sampled diagrams with this many uniform points per member (0 or omitted = extremes only). */
  readonly points?: number;
}

type Json = null | boolean | number | string | Json[] | { [key: string]: Json };

const FORCE_NAMES = ["fx", "fy", "mz"] as const;

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
  for (const id of result.memberIds) {
    const d = memberDiagram(result, id, r.id, { points: options.points || 2 });
    members[id] = options.points ? ({ extremes: d.extremes, samples: d.samples } as unknown as Json) : (d.extremes as unknown as Json);
  }
  return {
    kind: r.kind,
    ...(r.kind === "combination" ? { factors: Object.fromEntries(r.sources.map((s) => [s.caseId, s.factor])) } : {}),
    displacements: perNode(result.nodeIds, r.displacements, DOF_NAMES),
    reactions: perNode(result.nodeIds, r.reactions, FORCE_NAMES, supported),
    endForces: perMember(result.memberIds, r.endForces),
    [options.points ? "diagrams" : "diagramExtremes"]: members,
    equilibrium: { ...r.equilibrium },
    relativeResidual: r.relativeResidual,
  };
}

function envelopeToJson(result: AnalysisResult, e: VectorEnvelope, of: ReadonlyArray<string>, kind: "node" | "member", names: ReadonlyArray<string>): Json {
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

const END_FORCE_NAMES = ["startFx", "startFy", "startMz", "endFx", "endFy", "endMz"];

export function resultToJson(result: AnalysisResult, options: SerializeOptions = {}): Json {
  const supported = supportedNodes(result);
  const envelopes: Record<string, Json> = {};
  for (const [id, env] of Object.entries(result.envelopes)) {
    envelopes[id] = {
      of: [...env.of],
      displacements: envelopeToJson(result, env.displacements, env.of, "node", DOF_NAMES),
      reactions: envelopeToJson(result, env.reactions, env.of, "node", FORCE_NAMES),
      endForces: envelopeToJson(result, env.endForces, env.of, "member", END_FORCE_NAMES),
      diagramExtremes: Object.fromEntries(result.memberIds.map((m) => [m, memberEnvelope(result, m, id, { points: 2 }).extremes as unknown as Json])),
    };
  }
  return {
    engineVersion: result.engineVersion,
    analysis: { ...result.analysis },
    stats: { ...result.stats },
    warnings: result.warnings.map((w) => ({ ...w })),
    loadCases: Object.fromEntries(Object.values(result.loadCases).map((r) => [r.id, caseToJson(result, r, supported, options)])),
    combinations: Object.fromEntries(Object.values(result.combinations).map((r) => [r.id, caseToJson(result, r, supported, options)])),
    envelopes,
  };
}
