/**
 * The model a standard's inputs build: its templates expanded over their loop variables (`each`), kept where
 * their condition holds (`when`), every number evaluated and converted to SI for the engine. Total: a bad
 * count, a missing node or a value of the wrong kind is a problem with its path, never a crash.
 */
import type { ModelInput } from "@/lib/engine";
import { SUPPORT_PRESETS, type ModelTemplate } from "./definition";
import { compileExpression, ExpressionError } from "./expressions";
import { describeDimension, hasDimensionOf, toSI, type Quantity, type Value } from "./units";

/** Most entries one list of the model may expand to, and most values one loop variable may take. */
export const MAX_GENERATED = 5_000;
export const MAX_LOOP_VALUES = 1_000;

export class GenerateError extends Error {
  constructor(
    readonly path: ReadonlyArray<PropertyKey>,
    message: string,
  ) {
    super(message);
  }
}

type Scope = ReadonlyMap<string, Value>;

/** Values already worked out while one model is generated (generateModel sets it, and drops it when done). */
let generation: { values: Map<string, Value>; ids: WeakMap<object, number> } | null = null;

/** A key for a value: numbers, texts and conditions by what they are, quantities by which object they are. */
function keyOf(value: Value | undefined): string {
  if (typeof value !== "object" || value === null) return `${typeof value}:${String(value)}`;
  const ids = generation!.ids;
  let id = ids.get(value);
  if (id === undefined) {
    id = nextId++;
    ids.set(value, id);
  }
  return `#${id}`;
}
let nextId = 0;

/** Evaluate an expression in a scope; a refusal becomes a GenerateError at the given path. */
export function evaluateAt(source: string, scope: Scope, path: ReadonlyArray<PropertyKey>): Value {
  try {
    const compiled = compileExpression(source, scope);
    if (!generation) return compiled.evaluate(scope);
    // While a model is generated, an expression met again with the same values (`E`, `-w_D`, `j - 1` for the
    // same j) gives the value it gave; expressions have no side effects, so only the time is saved.
    let key = source;
    for (const name of compiled.names) key += `\u0000${keyOf(scope.get(name))}`;
    let value = generation.values.get(key);
    if (value === undefined) {
      value = compiled.evaluate(scope);
      generation.values.set(key, value);
    }
    return value;
  } catch (error) {
    if (error instanceof ExpressionError) throw new GenerateError(path, error.message);
    throw error;
  }
}

/** An expression that must give a value of a quantity, in SI. */
export function quantityAt(source: string, quantity: Quantity, scope: Scope, path: ReadonlyArray<PropertyKey>): number {
  const value = evaluateAt(source, scope, path);
  if (!hasDimensionOf(value, quantity)) {
    // A bare 0 is zero of anything.
    if (value === 0) return 0;
    throw new GenerateError(
      path,
      `\`${source}\` gives ${describeDimension(value)}; a ${quantity.replaceAll("-", " ")} is needed here${typeof value === "number" ? " (add its unit)" : ""}`,
    );
  }
  return toSI(value, quantity);
}

function conditionAt(source: string, scope: Scope, path: ReadonlyArray<PropertyKey>): boolean {
  const value = evaluateAt(source, scope, path);
  if (typeof value !== "boolean") throw new GenerateError(path, `\`${source}\` must be a condition (true or false)`);
  return value;
}

/** Fill the `{expression}` parts of an id template; each must give a whole number or a text. */
export function fillTemplate(template: string, scope: Scope, path: ReadonlyArray<PropertyKey>): string {
  return template.replace(/\{([^{}]+)\}/g, (_, source: string) => {
    const value = evaluateAt(source.trim(), scope, path);
    if (typeof value === "string") return value;
    if (typeof value === "number" && Number.isInteger(value)) return String(value);
    throw new GenerateError(path, `\`{${source}}\` in \`${template}\` must give a whole number or a text`);
  });
}

/** Every combination of the loop variables' values, each as a scope extending the given one. */
export function expand(
  each: Readonly<Record<string, string | ReadonlyArray<string>>> | undefined,
  scope: Scope,
  path: ReadonlyArray<PropertyKey>,
): Scope[] {
  let scopes: Scope[] = [scope];
  for (const [name, spec] of Object.entries(each ?? {})) {
    const values: Value[] = [];
    if (typeof spec === "string") {
      const [fromText, toText] = spec.split("..").map((s) => s.trim());
      const from = evaluateAt(fromText, scope, [...path, "each", name]);
      const to = evaluateAt(toText, scope, [...path, "each", name]);
      if (typeof from !== "number" || typeof to !== "number" || !Number.isInteger(from) || !Number.isInteger(to))
        throw new GenerateError([...path, "each", name], `the range \`${spec}\` must run between whole numbers`);
      if (to - from + 1 > MAX_LOOP_VALUES)
        throw new GenerateError(
          [...path, "each", name],
          `the range \`${spec}\` has ${to - from + 1} values; at most ${MAX_LOOP_VALUES}`,
        );
      for (let v = from; v <= to; v++) values.push(v);
    } else values.push(...spec);
    const next: Scope[] = [];
    for (const s of scopes) {
      for (const v of values) {
        if (next.length >= MAX_GENERATED)
          throw new GenerateError([...path, "each"], `the repetition makes more than ${MAX_GENERATED} entries`);
        next.push(new Map([...s, [name, v]]));
      }
    }
    scopes = next;
  }
  return scopes;
}

/** Expand a list of templates: each entry over its loop variables, kept where its condition holds. */
function expandList<T extends { each?: Record<string, string | string[]>; when?: string }>(
  items: ReadonlyArray<T>,
  scope: Scope,
  path: ReadonlyArray<PropertyKey>,
): { item: T; scope: Scope; path: PropertyKey[] }[] {
  const out: { item: T; scope: Scope; path: PropertyKey[] }[] = [];
  items.forEach((item, i) => {
    const itemPath = [...path, i];
    for (const s of expand(item.each, scope, itemPath)) {
      if (item.when !== undefined && !conditionAt(item.when, s, [...itemPath, "when"])) continue;
      if (out.length >= MAX_GENERATED) throw new GenerateError(path, `the list makes more than ${MAX_GENERATED} entries`);
      out.push({ item, scope: s, path: itemPath });
    }
  });
  return out;
}

type Restraint = NonNullable<NonNullable<ModelInput["nodes"][number]["support"]>["ux"]>;

function restraintAt(
  spec: NonNullable<Extract<ModelTemplate["nodes"][number]["support"], object>["ux"]>,
  direction: "ux" | "uy" | "rz",
  scope: Scope,
  path: PropertyKey[],
): Restraint {
  if (spec === "fixed" || spec === "free") return spec;
  if ("if" in spec) {
    const value = evaluateAt(spec.if, scope, [...path, "if"]);
    if (value !== "fixed" && value !== "free")
      throw new GenerateError([...path, "if"], `\`${spec.if}\` must give 'fixed' or 'free', not ${JSON.stringify(value)}`);
    return value;
  }
  if ("spring" in spec) {
    const q: Quantity = direction === "rz" ? "rotational-stiffness" : "translational-stiffness";
    return { kind: "spring", stiffness: quantityAt(spec.spring, q, scope, [...path, "spring"]) };
  }
  const value = quantityAt(spec.settlement, direction === "rz" ? "angle" : "length", scope, [...path, "settlement"]);
  return {
    kind: "prescribed",
    value,
    ...(spec.load_case !== undefined ? { loadCase: fillTemplate(spec.load_case, scope, [...path, "load_case"]) } : {}),
  };
}

export interface GeneratedModel {
  readonly model: ModelInput;
  /** Member ids by group name. */
  readonly groups: ReadonlyMap<string, ReadonlyArray<string>>;
}

function uniqueIds(ids: ReadonlyArray<{ id: string; path: PropertyKey[] }>, what: string): void {
  const seen = new Set<string>();
  for (const { id, path } of ids) {
    if (seen.has(id))
      throw new GenerateError(path, `two ${what}s are called \`${id}\`; ids must differ (use the loop variables in the id)`);
    seen.add(id);
  }
}

export function generateModel(template: ModelTemplate, scope: Scope): GeneratedModel {
  const outer = generation;
  generation = { values: new Map(), ids: new WeakMap() };
  try {
    return generateModelOnce(template, scope);
  } finally {
    generation = outer;
  }
}

function generateModelOnce(template: ModelTemplate, scope: Scope): GeneratedModel {
  const root = ["model"];
  const nodes = expandList(template.nodes, scope, [...root, "nodes"]).map(({ item, scope: s, path }) => {
    const id = fillTemplate(item.id, s, [...path, "id"]);
    const node: ModelInput["nodes"][number] = {
      id,
      x: quantityAt(item.x, "length", s, [...path, "x"]),
      y: quantityAt(item.y, "length", s, [...path, "y"]),
    };
    if (item.support !== undefined) {
      const spec = typeof item.support === "string" ? SUPPORT_PRESETS[item.support] : item.support;
      node.support = {
        ux: restraintAt(spec.ux ?? "free", "ux", s, [...path, "support", "ux"]),
        uy: restraintAt(spec.uy ?? "free", "uy", s, [...path, "support", "uy"]),
        rz: restraintAt(spec.rz ?? "free", "rz", s, [...path, "support", "rz"]),
      };
    }
    return { node, path };
  });
  uniqueIds(
    nodes.map((n) => ({ id: n.node.id, path: n.path })),
    "node",
  );
  const nodeIds = new Set(nodes.map((n) => n.node.id));

  const groups = new Map<string, string[]>();
  const members = expandList(template.members, scope, [...root, "members"]).map(({ item, scope: s, path }) => {
    const id = fillTemplate(item.id, s, [...path, "id"]);
    const start = fillTemplate(item.start, s, [...path, "start"]);
    const end = fillTemplate(item.end, s, [...path, "end"]);
    for (const [key, ref] of [
      ["start", start],
      ["end", end],
    ] as const)
      if (!nodeIds.has(ref))
        throw new GenerateError([...path, key], `member \`${id}\` ${key}s at node \`${ref}\`, which the model does not have`);
    const member: NonNullable<ModelInput["members"]>[number] = {
      id,
      start,
      end,
      kind: item.kind,
      E: quantityAt(item.E, "stress", s, [...path, "E"]),
      A: quantityAt(item.A, "area", s, [...path, "A"]),
    };
    if (item.I !== undefined) member.I = quantityAt(item.I, "second-moment-of-area", s, [...path, "I"]);
    if (item.density !== undefined) member.density = quantityAt(item.density, "density", s, [...path, "density"]);
    if (item.releases) member.releases = { startMoment: item.releases.start ?? false, endMoment: item.releases.end ?? false };
    for (const g of typeof item.group === "string" ? [item.group] : (item.group ?? []))
      groups.set(g, [...(groups.get(g) ?? []), id]);
    return { member, path };
  });
  uniqueIds(
    members.map((m) => ({ id: m.member.id, path: m.path })),
    "member",
  );
  const memberIds = new Set(members.map((m) => m.member.id));
  const memberRef = (ref: string, path: PropertyKey[]) => {
    if (!memberIds.has(ref)) throw new GenerateError(path, `the model has no member \`${ref}\``);
    return ref;
  };

  const loadCases = expandList(template.load_cases, scope, [...root, "load_cases"]).map(({ item, scope: s, path }) => {
    const id = fillTemplate(item.id, s, [...path, "id"]);
    const loads = expandList(item.loads, s, [...path, "loads"]).map(({ item: load, scope: ls, path: lp }) => {
      if ("node" in load) {
        const node = fillTemplate(load.node, ls, [...lp, "node"]);
        if (!nodeIds.has(node)) throw new GenerateError([...lp, "node"], `the model has no node \`${node}\``);
        return {
          kind: "nodal" as const,
          node,
          fx: load.fx === undefined ? 0 : quantityAt(load.fx, "force", ls, [...lp, "fx"]),
          fy: load.fy === undefined ? 0 : quantityAt(load.fy, "force", ls, [...lp, "fy"]),
          mz: load.mz === undefined ? 0 : quantityAt(load.mz, "moment", ls, [...lp, "mz"]),
        };
      }
      if ("self_weight" in load)
        return {
          kind: "self-weight" as const,
          factor: quantityAt(load.self_weight, "dimensionless", ls, [...lp, "self_weight"]),
        };
      const member = memberRef(fillTemplate(load.member, ls, [...lp, "member"]), [...lp, "member"]);
      if ("couple" in load)
        return {
          kind: "couple" as const,
          member,
          value: quantityAt(load.couple, "moment", ls, [...lp, "couple"]),
          position: quantityAt(load.at, "length", ls, [...lp, "at"]),
        };
      if ("P" in load)
        return {
          kind: "point" as const,
          member,
          direction: load.direction,
          value: quantityAt(load.P, "force", ls, [...lp, "P"]),
          position: quantityAt(load.at, "length", ls, [...lp, "at"]),
        };
      return {
        kind: "distributed" as const,
        member,
        direction: load.direction,
        wStart: quantityAt(load.w, "force-per-length", ls, [...lp, "w"]),
        ...(load.w_end !== undefined ? { wEnd: quantityAt(load.w_end, "force-per-length", ls, [...lp, "w_end"]) } : {}),
        ...(load.from !== undefined ? { from: quantityAt(load.from, "length", ls, [...lp, "from"]) } : {}),
        ...(load.to !== undefined ? { to: quantityAt(load.to, "length", ls, [...lp, "to"]) } : {}),
        ...(load.projected ? { projected: true } : {}),
      };
    });
    return { loadCase: { id, ...(item.name ? { name: item.name } : {}), loads }, path };
  });
  uniqueIds(
    loadCases.map((c) => ({ id: c.loadCase.id, path: c.path })),
    "load case",
  );
  const caseIds = new Set(loadCases.map((c) => c.loadCase.id));

  const combinations = expandList(template.combinations, scope, [...root, "combinations"]).map(({ item, scope: s, path }) => {
    const id = fillTemplate(item.id, s, [...path, "id"]);
    const factors: Record<string, number> = {};
    for (const [caseTemplate, factor] of Object.entries(item.factors)) {
      const caseId = fillTemplate(caseTemplate, s, [...path, "factors", caseTemplate]);
      if (!caseIds.has(caseId))
        throw new GenerateError([...path, "factors", caseTemplate], `the model has no load case \`${caseId}\``);
      factors[caseId] = quantityAt(factor, "dimensionless", s, [...path, "factors", caseTemplate]);
    }
    return { combination: { id, ...(item.name ? { name: item.name } : {}), factors }, path };
  });
  uniqueIds(
    [
      ...loadCases.map((c) => ({ id: c.loadCase.id, path: c.path })),
      ...combinations.map((c) => ({ id: c.combination.id, path: c.path })),
    ],
    "load case or combination",
  );

  const envelopes = expandList(template.envelopes, scope, [...root, "envelopes"]).map(({ item, scope: s, path }) => ({
    id: fillTemplate(item.id, s, [...path, "id"]),
    of: item.of.map((ref, k) => fillTemplate(ref, s, [...path, "of", k])),
  }));

  return {
    model: {
      nodes: nodes.map((n) => n.node),
      members: members.map((m) => m.member),
      loadCases: loadCases.map((c) => c.loadCase),
      combinations: combinations.map((c) => c.combination),
      envelopes,
    },
    groups,
  };
}
