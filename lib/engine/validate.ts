/**
 * Turns untrusted input into a Model, or into a list of errors a person can act on. Checks here are the ones
 * a schema cannot phrase well: non-finite numbers (named by path), references between ids, member lengths,
 * property signs, and load positions along members.
 */
import { z } from "zod";
import { ModelSchema, type Load, type Model } from "./model";
import { formatPath, type EngineError } from "./diagnostics";
import { DOF_NAMES } from "./dofs";
import { IdIndex, type IdLookup } from "./id-index";

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

function checkDuplicates(model: Model, nodeIndex: IdLookup, memberIndex: IdLookup, out: EngineError[]): void {
  const groups = [
    ["node", model.nodes, nodeIndex.size],
    ["member", model.members, memberIndex.size],
    ["load-case", model.loadCases, -1],
    ["combination", model.combinations, -1],
    ["envelope", model.envelopes, -1],
  ] as const;
  for (const [entity, items, distinct] of groups) {
    if (distinct === items.length) continue; // the index maps already prove the ids distinct
    const seen = new Set<string>();
    for (const item of items) {
      if (seen.has(item.id))
        out.push({ kind: "duplicate-id", entity, id: item.id, message: `Two ${entity}s share the id "${item.id}"` });
      seen.add(item.id);
    }
  }
  // Results are looked up by id across cases and combinations, so those must not collide either.
  const caseIds = new Set(model.loadCases.map((c) => c.id));
  for (const c of model.combinations) {
    if (caseIds.has(c.id))
      out.push({
        kind: "duplicate-id",
        entity: "combination",
        id: c.id,
        message: `Combination "${c.id}" has the same id as a load case`,
      });
  }
}

function positive(value: number | undefined, where: string, property: string, out: EngineError[]): void {
  if (value !== undefined && !(value > 0)) {
    const path = `${where}.${property}`;
    out.push({
      kind: "non-positive-property",
      path,
      property,
      value,
      message: `${path} is ${value}; ${property} must be greater than zero`,
    });
  }
}

function checkMembers(model: Model, nodeIndex: IdLookup, memberEnds: Int32Array, out: EngineError[]): Float64Array {
  const lengths = new Float64Array(model.members.length).fill(NaN);
  let extent = 0;
  for (const n of model.nodes) extent = Math.max(extent, Math.abs(n.x), Math.abs(n.y));
  extent ||= 1;
  model.members.forEach((m, i) => {
    const a = nodeIndex.get(m.start);
    const b = nodeIndex.get(m.end);
    if (a === undefined || b === undefined) {
      for (const [end, n] of [
        ["start", m.start],
        ["end", m.end],
      ] as const) {
        if (!nodeIndex.has(n))
          out.push({
            kind: "unknown-node",
            path: `members[${i}].${end}`,
            node: n,
            message: `Member ${m.id} refers to node "${n}", which does not exist`,
          });
      }
    } else {
      memberEnds[2 * i] = a;
      memberEnds[2 * i + 1] = b;
      const length = Math.hypot(model.nodes[b].x - model.nodes[a].x, model.nodes[b].y - model.nodes[a].y);
      if (!(length > ZERO_LENGTH_TOLERANCE * extent)) {
        out.push({
          kind: "zero-length-member",
          member: m.id,
          message: `Member ${m.id} has zero length: nodes ${m.start} and ${m.end} coincide`,
        });
      } else lengths[i] = length;
    }
    // Paths are built only when something is wrong: large models should not pay for strings.
    if (
      !(m.E > 0 && m.A > 0) ||
      m.I !== undefined ||
      m.cTop !== undefined ||
      m.cBottom !== undefined ||
      m.density !== undefined
    ) {
      const where = `members[${i}]`;
      positive(m.E, where, "E", out);
      positive(m.A, where, "A", out);
      positive(m.I, where, "I", out);
      positive(m.cTop, where, "cTop", out);
      positive(m.cBottom, where, "cBottom", out);
      positive(m.density, where, "density", out);
    }
    if (m.kind === "frame" && m.I === undefined) {
      out.push({
        kind: "missing-property",
        member: m.id,
        property: "I",
        message: `Frame member ${m.id} needs I (second moment of area)`,
      });
    }
  });
  return lengths;
}

function outside(x: number | undefined, L: number): boolean {
  // A small tolerance lets templates place loads at L computed with rounding.
  return x !== undefined && (x < -1e-9 * L || x > L * (1 + 1e-9));
}

function checkMemberLoad(
  load: Exclude<Load, { kind: "nodal" | "self-weight" }>,
  L: number,
  where: string,
  out: EngineError[],
): void {
  const positions: [string, number | undefined][] =
    load.kind === "distributed"
      ? [
          ["from", load.from],
          ["to", load.to],
        ]
      : [["position", load.position]];
  for (const [name, x] of positions) {
    if (outside(x, L))
      out.push({
        kind: "load-outside-member",
        path: `${where}.${name}`,
        member: load.member,
        message: `${where}.${name} = ${x} m lies outside member ${load.member} (length ${L} m)`,
      });
  }
  if (load.kind !== "distributed") return;
  if ((load.from ?? 0) >= (load.to ?? L))
    out.push({ kind: "invalid-load", path: where, message: `${where}: "from" must be less than "to"` });
  if (load.projected && load.direction.startsWith("local"))
    out.push({
      kind: "invalid-load",
      path: `${where}.projected`,
      message: `${where}: projected intensities need a global direction`,
    });
}

function checkLoads(model: Model, nodeIndex: IdLookup, memberIndex: IdLookup, lengths: Float64Array, out: EngineError[]): void {
  model.loadCases.forEach((lc, c) => {
    const loads = lc.loads;
    for (let l = 0; l < loads.length; l++) {
      const load = loads[l];
      if (load.kind === "self-weight") continue;
      if (load.kind === "nodal") {
        if (!nodeIndex.has(load.node))
          out.push({
            kind: "unknown-node",
            path: `loadCases[${c}].loads[${l}].node`,
            node: load.node,
            message: `A load in case ${lc.id} acts on node "${load.node}", which does not exist`,
          });
        continue;
      }
      const m = memberIndex.get(load.member);
      if (m === undefined) {
        out.push({
          kind: "unknown-member",
          path: `loadCases[${c}].loads[${l}].member`,
          member: load.member,
          message: `A load in case ${lc.id} acts on member "${load.member}", which does not exist`,
        });
        continue;
      }
      const L = lengths[m];
      if (!Number.isFinite(L)) continue;
      // Most loads are fine: check cheaply first, build the path string only for a real problem.
      const suspicious =
        load.kind === "distributed"
          ? load.from !== undefined || load.to !== undefined || (load.projected && load.direction.startsWith("local"))
          : outside(load.position, L);
      if (suspicious) checkMemberLoad(load, L, `loadCases[${c}].loads[${l}]`, out);
    }
  });
}

function checkResultReferences(model: Model, out: EngineError[]): void {
  const caseIds = new Set(model.loadCases.map((c) => c.id));
  model.nodes.forEach((n, i) => {
    if (!n.support) return;
    for (const dir of DOF_NAMES) {
      const r = n.support[dir];
      if (typeof r !== "object") continue;
      const path = `nodes[${i}].support.${dir}`;
      if (r.kind === "spring") positive(r.stiffness, path, "stiffness", out);
      else if (r.loadCase !== undefined && !caseIds.has(r.loadCase)) {
        out.push({
          kind: "unknown-load-case",
          path: `${path}.loadCase`,
          loadCase: r.loadCase,
          message: `Node ${n.id} settles in load case "${r.loadCase}", which does not exist`,
        });
      }
    }
  });
  model.combinations.forEach((combo, i) => {
    for (const caseId of Object.keys(combo.factors)) {
      if (!caseIds.has(caseId))
        out.push({
          kind: "unknown-load-case",
          path: `combinations[${i}].factors.${caseId}`,
          loadCase: caseId,
          message: `Combination ${combo.id} uses load case "${caseId}", which does not exist`,
        });
    }
  });
  const resultIds = new Set([...caseIds, ...model.combinations.map((c) => c.id)]);
  model.envelopes.forEach((env, i) => {
    env.of.forEach((rid, j) => {
      if (!resultIds.has(rid))
        out.push({
          kind: "unknown-result",
          path: `envelopes[${i}].of[${j}]`,
          id: rid,
          message: `Envelope ${env.id} includes "${rid}", which is neither a load case nor a combination`,
        });
    });
  });
}

export interface ValidModel {
  readonly model: Model;
  readonly nodeIndex: IdLookup;
  readonly memberIndex: IdLookup;
  /** Start and end node index of each member (2 per member), looked up once here. */
  readonly memberEnds: Int32Array;
}

export type ValidationOutcome = ({ ok: true } & ValidModel) | { ok: false; errors: EngineError[] };

/**
 * zod names an unknown key but not the ones it would have accepted; a person who typed `Fy` or `suport` needs
 * the list to fix it. The issue carries the object schema that refused the key, so its shape gives the list.
 */
const unknownKeyMessages: z.core.$ZodErrorMap = (issue) => {
  if (issue.code !== "unrecognized_keys" || !(issue.inst instanceof z.ZodObject)) return undefined;
  const keys = issue.keys.map((k) => `"${k}"`).join(", ");
  const valid = Object.keys(issue.inst.shape).join(", ");
  return `unknown key${issue.keys.length > 1 ? "s" : ""} ${keys}; the valid keys here are ${valid}`;
};

export function validateModel(input: unknown): ValidationOutcome {
  const parsed = ModelSchema.safeParse(input, { error: unknownKeyMessages });
  if (!parsed.success) {
    // The schema rejects NaN and ±Infinity too; name those precisely, by path, before anything else.
    const nonFinite: EngineError[] = [];
    findNonFinite(input, [], nonFinite);
    if (nonFinite.length > 0) return { ok: false, errors: nonFinite };
    return {
      ok: false,
      errors: parsed.error.issues.map((issue) => {
        const path = formatPath(issue.path);
        return { kind: "invalid-model", path, message: path ? `${path}: ${issue.message}` : issue.message };
      }),
    };
  }
  const model = parsed.data;
  const errors: EngineError[] = [];
  const nodeIndex = new IdIndex(model.nodes);
  const memberIndex = new IdIndex(model.members);
  checkDuplicates(model, nodeIndex, memberIndex, errors);
  const memberEnds = new Int32Array(2 * model.members.length);
  const lengths = checkMembers(model, nodeIndex, memberEnds, errors);
  checkLoads(model, nodeIndex, memberIndex, lengths, errors);
  checkResultReferences(model, errors);
  return errors.length > 0 ? { ok: false, errors } : { ok: true, model, nodeIndex, memberIndex, memberEnds };
}
