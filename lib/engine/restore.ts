/**
 * A stored run back into a result: the model JSON and the result JSON written by `resultToJson` (or its canonical
 * text, parsed) are all it takes. Everything diagrams need besides the result follows from the model
 * (`modelContext`), and JSON keeps every finite double exactly, so a calc sheet drawn from the database next
 * year gets the diagrams and extremes the analysing process drew (only the sign of a zero can differ, and
 * JSON prints both zeros alike).
 *
 * The result keeps the identity of the engine that made it (engineVersion, engineSourceHash), not the current
 * one. Load case and combination sources are taken from the model, in the order `analyze` used, so combined
 * span loads add up in the same order.
 */
import { validateModel } from "./validate";
import { modelContext, attachContext } from "./context";
import { DOF_NAMES } from "./dofs";
import { deepFreeze } from "./freeze";
import { END_FORCE_NAMES, FORCE_NAMES } from "./serialize";
import type { AnalysisResult, AnalysisStats } from "./analysis-types";
import type { CaseResult, EquilibriumResidual, LoadSource } from "./results";
import type { EnvelopeResult, VectorEnvelope } from "./combinations";
import type { EngineError, EngineWarning } from "./diagnostics";
import type { Model } from "./model";

export type RestoreOutcome =
  { readonly ok: true; readonly result: AnalysisResult } | { readonly ok: false; readonly errors: ReadonlyArray<EngineError> };

type JsonObject = Record<string, unknown>;

/** Reads the stored JSON, collecting a path-named error for anything missing or of the wrong type. */
class StoredReader {
  readonly errors: EngineError[] = [];

  fail(path: string, message: string): void {
    this.errors.push({ kind: "invalid-stored-result", path, message: `${path}: ${message}` });
  }

  object(value: unknown, path: string): JsonObject | null {
    if (value !== null && typeof value === "object" && !Array.isArray(value)) return value as JsonObject;
    this.fail(path, "expected an object");
    return null;
  }

  number(value: unknown, path: string): number {
    if (typeof value === "number" && Number.isFinite(value)) return value;
    this.fail(path, "expected a finite number");
    return 0;
  }

  string(value: unknown, path: string): string {
    if (typeof value === "string") return value;
    this.fail(path, "expected a string");
    return "";
  }

  /** The object's keys must be exactly `ids` (`subset`: any of them). */
  keys(o: JsonObject, ids: ReadonlyArray<string>, path: string, subset = false): void {
    const known = new Set(ids);
    for (const k of Object.keys(o)) if (!known.has(k)) this.fail(`${path}.${k}`, "not in the model");
    if (!subset) for (const id of ids) if (!(id in o)) this.fail(`${path}.${id}`, "missing");
  }

  /** names[d] of entry `ids[i]` → out[names.length·i + d] (the layout of dofs.ts for nodes); entries absent from a subset stay 0. */
  vector(value: unknown, ids: ReadonlyArray<string>, names: ReadonlyArray<string>, path: string, subset = false): Float64Array {
    const out = new Float64Array(names.length * ids.length);
    const o = this.object(value, path);
    if (!o) return out;
    this.keys(o, ids, path, subset);
    ids.forEach((id, i) => {
      if (!(id in o)) return;
      const entry = this.object(o[id], `${path}.${id}`);
      if (entry) names.forEach((name, d) => (out[names.length * i + d] = this.number(entry[name], `${path}.${id}.${name}`)));
    });
    return out;
  }
}

function readEndForces(reader: StoredReader, value: unknown, memberIds: ReadonlyArray<string>, path: string): Float64Array {
  const out = new Float64Array(6 * memberIds.length);
  const o = reader.object(value, path);
  if (!o) return out;
  reader.keys(o, memberIds, path);
  memberIds.forEach((id, m) => {
    if (!(id in o)) return;
    const ends = reader.object(o[id], `${path}.${id}`);
    if (!ends) return;
    (["start", "end"] as const).forEach((end, e) => {
      const f = reader.object(ends[end], `${path}.${id}.${end}`);
      if (f) FORCE_NAMES.forEach((name, d) => (out[6 * m + 3 * e + d] = reader.number(f[name], `${path}.${id}.${end}.${name}`)));
    });
  });
  return out;
}

function readCase(
  reader: StoredReader,
  model: Model,
  value: unknown,
  id: string,
  kind: CaseResult["kind"],
  sources: LoadSource[],
  path: string,
): CaseResult {
  const nodeIds = model.nodes.map((n) => n.id);
  const o = reader.object(value, path) ?? {};
  if (o.kind !== kind) reader.fail(`${path}.kind`, `expected "${kind}"`);
  if (kind === "combination") {
    // The factors stored must be the model's: the combination is rebuilt from the model's table.
    const factors = reader.object(o.factors, `${path}.factors`);
    if (factors) {
      reader.keys(
        factors,
        sources.map((s) => s.caseId),
        `${path}.factors`,
      );
      for (const s of sources)
        if (s.caseId in factors && factors[s.caseId] !== s.factor)
          reader.fail(`${path}.factors.${s.caseId}`, `stored ${String(factors[s.caseId])}, the model says ${s.factor}`);
    }
  }
  const eq = reader.object(o.equilibrium, `${path}.equilibrium`) ?? {};
  const equilibrium: EquilibriumResidual = {
    fx: reader.number(eq.fx, `${path}.equilibrium.fx`),
    fy: reader.number(eq.fy, `${path}.equilibrium.fy`),
    mz: reader.number(eq.mz, `${path}.equilibrium.mz`),
    relative: reader.number(eq.relative, `${path}.equilibrium.relative`),
  };
  return {
    id,
    kind,
    sources,
    displacements: reader.vector(o.displacements, nodeIds, DOF_NAMES, `${path}.displacements`),
    // Only nodes with a reaction are written; the others' reactions are zero.
    reactions: reader.vector(o.reactions, nodeIds, FORCE_NAMES, `${path}.reactions`, true),
    endForces: readEndForces(
      reader,
      o.endForces,
      model.members.map((m) => m.id),
      `${path}.endForces`,
    ),
    equilibrium,
    relativeResidual: reader.number(o.relativeResidual, `${path}.relativeResidual`),
  };
}

function readVectorEnvelope(
  reader: StoredReader,
  value: unknown,
  ids: ReadonlyArray<string>,
  names: ReadonlyArray<string>,
  of: ReadonlyArray<string>,
  path: string,
): VectorEnvelope {
  const n = names.length * ids.length;
  const env = { max: new Float64Array(n), min: new Float64Array(n), maxFrom: new Uint16Array(n), minFrom: new Uint16Array(n) };
  const o = reader.object(value, path);
  if (!o) return env;
  reader.keys(o, ids, path);
  ids.forEach((id, i) => {
    const entry = id in o ? reader.object(o[id], `${path}.${id}`) : null;
    if (!entry) return;
    names.forEach((name, d) => {
      const where = `${path}.${id}.${name}`;
      const e = reader.object(entry[name], where);
      if (!e) return;
      const k = names.length * i + d;
      env.max[k] = reader.number(e.max, `${where}.max`);
      env.min[k] = reader.number(e.min, `${where}.min`);
      for (const [key, target] of [
        ["maxFrom", env.maxFrom],
        ["minFrom", env.minFrom],
      ] as const) {
        const from = of.indexOf(reader.string(e[key], `${where}.${key}`));
        if (from < 0) reader.fail(`${where}.${key}`, "not one of the enveloped results");
        else target[k] = from;
      }
    });
  });
  return env;
}

function readWarnings(reader: StoredReader, value: unknown): EngineWarning[] {
  if (!Array.isArray(value)) {
    reader.fail("warnings", "expected an array");
    return [];
  }
  return value.map((w, i) => {
    const o = reader.object(w, `warnings[${i}]`) ?? {};
    if (o.kind !== "ill-conditioned") reader.fail(`warnings[${i}].kind`, 'expected "ill-conditioned"');
    return {
      kind: "ill-conditioned",
      loadCase: reader.string(o.loadCase, `warnings[${i}].loadCase`),
      relativeResidual: reader.number(o.relativeResidual, `warnings[${i}].relativeResidual`),
      message: reader.string(o.message, `warnings[${i}].message`),
    };
  });
}

function readStats(reader: StoredReader, value: unknown): AnalysisStats {
  const o = reader.object(value, "stats") ?? {};
  return {
    nodes: reader.number(o.nodes, "stats.nodes"),
    members: reader.number(o.members, "stats.members"),
    equations: reader.number(o.equations, "stats.equations"),
    nnzL: reader.number(o.nnzL, "stats.nnzL"),
  };
}

/**
 * The result stored as JSON (`resultToJson`, any `points`), with the model it was made from, as a result that
 * memberDiagram, memberEnvelope, the id accessors and resultToJson accept. Model errors come back as from
 * `analyze`; a stored result that does not fit the model as `invalid-stored-result` errors naming the path.
 */
export function restoreResult(modelInput: unknown, stored: unknown): RestoreOutcome {
  const valid = validateModel(modelInput);
  if (!valid.ok) return { ok: false, errors: valid.errors };
  const { model } = valid;
  const reader = new StoredReader();
  const root = reader.object(stored, "result");
  if (!root) return { ok: false, errors: reader.errors };
  const nodeIds = model.nodes.map((n) => n.id);
  const memberIds = model.members.map((m) => m.id);

  const analysis = reader.object(root.analysis, "analysis");
  if (analysis && analysis.kind !== model.analysis.kind)
    reader.fail("analysis.kind", `expected "${model.analysis.kind}", the model's analysis`);
  const caseIndex = new Map(model.loadCases.map((c, i) => [c.id, i]));

  const storedCases = reader.object(root.loadCases, "loadCases") ?? {};
  reader.keys(storedCases, [...caseIndex.keys()], "loadCases");
  const cases = model.loadCases.map((c, i) =>
    readCase(
      reader,
      model,
      storedCases[c.id],
      c.id,
      "load-case",
      [{ caseIndex: i, caseId: c.id, factor: 1 }],
      `loadCases.${c.id}`,
    ),
  );

  const storedCombos = reader.object(root.combinations, "combinations") ?? {};
  reader.keys(
    storedCombos,
    model.combinations.map((c) => c.id),
    "combinations",
  );
  const combos = model.combinations.map((combo) => {
    // The order analyze used (combinations.ts): the model's factor table as Object.entries lists it.
    const sources = Object.entries(combo.factors).map(([id, factor]) => ({ caseIndex: caseIndex.get(id)!, caseId: id, factor }));
    return readCase(reader, model, storedCombos[combo.id], combo.id, "combination", sources, `combinations.${combo.id}`);
  });

  const storedEnvelopes = reader.object(root.envelopes, "envelopes") ?? {};
  reader.keys(
    storedEnvelopes,
    model.envelopes.map((e) => e.id),
    "envelopes",
  );
  const envelopes: Record<string, EnvelopeResult> = {};
  for (const env of model.envelopes) {
    const path = `envelopes.${env.id}`;
    const o = reader.object(storedEnvelopes[env.id], path) ?? {};
    if (!Array.isArray(o.of) || o.of.length !== env.of.length || o.of.some((id, i) => id !== env.of[i]))
      reader.fail(`${path}.of`, `expected ${JSON.stringify(env.of)}, the model's envelope`);
    envelopes[env.id] = {
      id: env.id,
      of: env.of,
      displacements: readVectorEnvelope(reader, o.displacements, nodeIds, DOF_NAMES, env.of, `${path}.displacements`),
      reactions: readVectorEnvelope(reader, o.reactions, nodeIds, FORCE_NAMES, env.of, `${path}.reactions`),
      endForces: readVectorEnvelope(reader, o.endForces, memberIds, END_FORCE_NAMES, env.of, `${path}.endForces`),
    };
  }

  const result: AnalysisResult = {
    engineVersion: reader.string(root.engineVersion, "engineVersion"),
    engineSourceHash: reader.string(root.engineSourceHash, "engineSourceHash"),
    analysis: model.analysis,
    nodeIds,
    memberIds,
    loadCases: Object.fromEntries(cases.map((r) => [r.id, r])),
    combinations: Object.fromEntries(combos.map((r) => [r.id, r])),
    envelopes,
    warnings: readWarnings(reader, root.warnings),
    stats: readStats(reader, root.stats),
  };
  if (reader.errors.length > 0) return { ok: false, errors: reader.errors };
  deepFreeze(result);
  attachContext(result, modelContext(valid));
  return { ok: true, result };
}
