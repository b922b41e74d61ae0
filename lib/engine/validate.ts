/**
 * Turns untrusted input into a Model, or into a list of errors a person can act on. Checks here are the ones
 * a schema cannot phrase well: non-finite numbers (named by path), references between ids, member lengths,
 * property signs, and load positions along members.
 */
import { ModelSchema, type Model } from "./model";
import { formatPath, type EngineError } from "./diagnostics";
import { memberFrame } from "./elements";

/** Relative length below which a member counts as zero-length. */
const ZERO_LENGTH_TOLERANCE = 1e-12;

/** Walks the raw input once; the path array is reused (push/pop) so large models cost no allocation. */
function findNonFinite(value: unknown, path: PropertyKey[], out: EngineError[]): void {
  if (typeof value === "number") {
    if (!Number.isFinite(value)) {
      const where = formatPath(path);
      out.push({ kind: "non-finite", path: where, message: `${where} is ${String(value)}; every number must be finite` });
    }
  } else if (Array.isArray(value)) {
    for (let i = 0; i < value.length; i++) {
      const v = value[i];
      if (v === null || (typeof v !== "number" && typeof v !== "object")) continue;
      path.push(i);
      findNonFinite(v, path, out);
      path.pop();
    }
  } else if (value !== null && typeof value === "object") {
    for (const k in value) {
      const v = (value as Record<string, unknown>)[k];
      if (v === null || (typeof v !== "number" && typeof v !== "object")) continue;
      path.push(k);
      findNonFinite(v, path, out);
      path.pop();
    }
  }
}

function checkDuplicates(model: Model, out: EngineError[]): void {
  const groups = [
    ["node", model.nodes],
    ["member", model.members],
    ["load-case", model.loadCases],
    ["combination", model.combinations],
    ["envelope", model.envelopes],
  ] as const;
  for (const [entity, items] of groups) {
    const seen = new Set<string>();
    for (const item of items) {
      if (seen.has(item.id)) out.push({ kind: "duplicate-id", entity, id: item.id, message: `Two ${entity}s share the id "${item.id}"` });
      seen.add(item.id);
    }
  }
  // Results are looked up by id across cases and combinations, so those must not collide either.
  const caseIds = new Set(model.loadCases.map((c) => c.id));
  for (const c of model.combinations) {
    if (caseIds.has(c.id)) out.push({ kind: "duplicate-id", entity: "combination", id: c.id, message: `Combination "${c.id}" has the same id as a load case` });
  }
}

function positive(value: number | undefined, path: string, property: string, out: EngineError[]): void {
  if (value !== undefined && !(value > 0)) {
    out.push({ kind: "non-positive-property", path, property, value, message: `${path} is ${value}; ${property} must be greater than zero` });
  }
}

function checkMembers(model: Model, nodeIndex: Map<string, number>, out: EngineError[]): number[] {
  const lengths: number[] = [];
  const extent = model.nodes.reduce((e, n) => Math.max(e, Math.abs(n.x), Math.abs(n.y)), 0) || 1;
  model.members.forEach((m, i) => {
    const where = `members[${i}]`;
    const a = nodeIndex.get(m.start);
    const b = nodeIndex.get(m.end);
    for (const [end, n] of [["start", m.start], ["end", m.end]] as const) {
      if (!nodeIndex.has(n)) out.push({ kind: "unknown-node", path: `${where}.${end}`, node: n, message: `Member ${m.id} refers to node "${n}", which does not exist` });
    }
    lengths.push(NaN);
    if (a !== undefined && b !== undefined) {
      const f = memberFrame(model.nodes[a].x, model.nodes[a].y, model.nodes[b].x, model.nodes[b].y);
      if (!(f.length > ZERO_LENGTH_TOLERANCE * extent)) {
        out.push({ kind: "zero-length-member", member: m.id, message: `Member ${m.id} has zero length: nodes ${m.start} and ${m.end} coincide` });
      } else lengths[i] = f.length;
    }
    positive(m.E, `${where}.E`, "E", out);
    positive(m.A, `${where}.A`, "A", out);
    positive(m.I, `${where}.I`, "I", out);
    positive(m.cTop, `${where}.cTop`, "cTop", out);
    positive(m.cBottom, `${where}.cBottom`, "cBottom", out);
    positive(m.density, `${where}.density`, "density", out);
    if (m.kind === "frame" && m.I === undefined) {
      out.push({ kind: "missing-property", member: m.id, property: "I", message: `Frame member ${m.id} needs I (second moment of area)` });
    }
  });
  return lengths;
}

function checkPosition(x: number | undefined, L: number, path: string, member: string, out: EngineError[]): void {
  // A small tolerance lets templates place loads at L computed with rounding.
  if (x !== undefined && (x < -1e-9 * L || x > L * (1 + 1e-9))) {
    out.push({ kind: "load-outside-member", path, member, message: `${path} = ${x} m lies outside member ${member} (length ${L} m)` });
  }
}

function checkLoads(model: Model, nodeIndex: Map<string, number>, lengths: number[], out: EngineError[]): void {
  const memberIndex = new Map(model.members.map((m, i) => [m.id, i]));
  model.loadCases.forEach((lc, c) => {
    lc.loads.forEach((load, l) => {
      const where = `loadCases[${c}].loads[${l}]`;
      if (load.kind === "self-weight") return;
      if (load.kind === "nodal") {
        if (!nodeIndex.has(load.node)) out.push({ kind: "unknown-node", path: `${where}.node`, node: load.node, message: `A load in case ${lc.id} acts on node "${load.node}", which does not exist` });
        return;
      }
      const m = memberIndex.get(load.member);
      if (m === undefined) {
        out.push({ kind: "unknown-member", path: `${where}.member`, member: load.member, message: `A load in case ${lc.id} acts on member "${load.member}", which does not exist` });
        return;
      }
      const L = lengths[m];
      if (!Number.isFinite(L)) return;
      if (load.kind === "distributed") {
        checkPosition(load.from, L, `${where}.from`, load.member, out);
        checkPosition(load.to, L, `${where}.to`, load.member, out);
        if ((load.from ?? 0) >= (load.to ?? L)) out.push({ kind: "invalid-load", path: where, message: `${where}: "from" must be less than "to"` });
        if (load.projected && load.direction.startsWith("local")) out.push({ kind: "invalid-load", path: `${where}.projected`, message: `${where}: projected intensities need a global direction` });
      } else checkPosition(load.position, L, `${where}.position`, load.member, out);
    });
  });
}

function checkResultReferences(model: Model, out: EngineError[]): void {
  const caseIds = new Set(model.loadCases.map((c) => c.id));
  model.nodes.forEach((n, i) => {
    for (const dir of ["ux", "uy", "rz"] as const) {
      const r = n.support?.[dir];
      if (typeof r !== "object") continue;
      const path = `nodes[${i}].support.${dir}`;
      if (r.kind === "spring") positive(r.stiffness, `${path}.stiffness`, "spring stiffness", out);
      else if (r.loadCase !== undefined && !caseIds.has(r.loadCase)) {
        out.push({ kind: "unknown-load-case", path: `${path}.loadCase`, loadCase: r.loadCase, message: `Node ${n.id} settles in load case "${r.loadCase}", which does not exist` });
      }
    }
  });
  model.combinations.forEach((combo, i) => {
    for (const caseId of Object.keys(combo.factors)) {
      if (!caseIds.has(caseId)) out.push({ kind: "unknown-load-case", path: `combinations[${i}].factors.${caseId}`, loadCase: caseId, message: `Combination ${combo.id} uses load case "${caseId}", which does not exist` });
    }
  });
  const resultIds = new Set([...caseIds, ...model.combinations.map((c) => c.id)]);
  model.envelopes.forEach((env, i) => {
    env.of.forEach((rid, j) => {
      if (!resultIds.has(rid)) out.push({ kind: "unknown-result", path: `envelopes[${i}].of[${j}]`, id: rid, message: `Envelope ${env.id} includes "${rid}", which is neither a load case nor a combination` });
    });
  });
}

export type ValidationOutcome = { ok: true; model: Model; lengths: number[] } | { ok: false; errors: EngineError[] };

export function validateModel(input: unknown): ValidationOutcome {
  const errors: EngineError[] = [];
  findNonFinite(input, [], errors);
  if (errors.length > 0) return { ok: false, errors };
  const parsed = ModelSchema.safeParse(input);
  if (!parsed.success) {
    return {
      ok: false,
      errors: parsed.error.issues.map((issue) => {
        const path = formatPath(issue.path);
        return { kind: "invalid-model", path, message: path ? `${path}: ${issue.message}` : issue.message };
      }),
    };
  }
  const model = parsed.data;
  const nodeIndex = new Map(model.nodes.map((n, i) => [n.id, i]));
  checkDuplicates(model, errors);
  const lengths = checkMembers(model, nodeIndex, errors);
  checkLoads(model, nodeIndex, lengths, errors);
  checkResultReferences(model, errors);
  return errors.length > 0 ? { ok: false, errors } : { ok: true, model, lengths };
}
