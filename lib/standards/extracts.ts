/**
 * Extracts: named quantities read off the engine's results, always with where they occur (node or member,
 * load case or combination, position along the member). Checks and the narrative read these, never the
 * engine's arrays.
 */
import {
  memberDiagram,
  memberForces,
  nodeDisplacement,
  nodeReaction,
  type AnalysisResult,
  type DiagramQuantity,
  type MemberDiagram,
  type MemberForces,
  type ModelInput,
} from "@/lib/engine";
import type { ExtractDefinition } from "./definition";
import { GenerateError, fillTemplate, quantityAt } from "./generate";
import type { Quantity, Value } from "./units";

export type ResultQuantity = "N" | "V" | "M" | "deflection" | "relative_deflection";

export const QUANTITY_OF: Readonly<Record<ResultQuantity | "fx" | "fy" | "mz" | "ux" | "uy" | "rz", Quantity>> = {
  N: "force",
  V: "force",
  M: "moment",
  deflection: "length",
  relative_deflection: "length",
  fx: "force",
  fy: "force",
  mz: "moment",
  ux: "length",
  uy: "length",
  rz: "angle",
};

const DIAGRAM_OF: Readonly<Record<ResultQuantity, DiagramQuantity>> = {
  N: "N",
  V: "V",
  M: "M",
  deflection: "deflection",
  relative_deflection: "relativeDeflection",
};

/** Where a value was read: a node or a member (with the distance from its start node), under a result. */
export interface Where {
  readonly node?: string;
  readonly member?: string;
  /** m from the member's start node. */
  readonly x?: number;
  readonly under: string;
}

export interface ExtractValue {
  /** SI value (N, m, N·m, rad). */
  readonly value: number;
  readonly quantity: Quantity;
  readonly where: Where;
}

type Scope = ReadonlyMap<string, Value>;

export interface ResultsView {
  readonly model: ModelInput;
  readonly result: AnalysisResult;
  readonly groups: ReadonlyMap<string, ReadonlyArray<string>>;
  /** Diagrams are built once per member and result. */
  diagram(member: string, under: string): MemberDiagram;
  /** N, V and M alone (no displacements), built once per member and result: what a check at each section reads. */
  forces(member: string, under: string): MemberForces;
}

export function resultsView(
  model: ModelInput,
  result: AnalysisResult,
  groups: ReadonlyMap<string, ReadonlyArray<string>>,
): ResultsView {
  return {
    model,
    result,
    groups,
    diagram: perMemberAndResult((member, under) => memberDiagram(result, member, under)),
    forces: perMemberAndResult((member, under) => memberForces(result, member, under)),
  };
}

/** `build`, called once per member and result and then answered from memory. */
function perMemberAndResult<T>(build: (member: string, under: string) => T): (member: string, under: string) => T {
  const cache = new Map<string, T>();
  return (member, under) => {
    const key = `${member}\u0000${under}`;
    let value = cache.get(key);
    if (value === undefined) {
      value = build(member, under);
      cache.set(key, value);
    }
    return value;
  };
}

/** The results an extract or check reads, as ids of load cases and combinations. */
export function resultIds(view: ResultsView, under: string | ReadonlyArray<string>, scope: Scope, path: PropertyKey[]): string[] {
  const { result } = view;
  if (under === "all_combinations") {
    const ids = Object.keys(result.combinations);
    if (ids.length === 0) throw new GenerateError(path, "the model has no combinations to run over");
    return ids;
  }
  const refs = typeof under === "string" ? [under] : under;
  const out: string[] = [];
  refs.forEach((ref, k) => {
    const id = fillTemplate(ref, scope, typeof under === "string" ? path : [...path, k]);
    if (result.envelopes[id]) out.push(...result.envelopes[id].of);
    else if (result.loadCases[id] || result.combinations[id]) out.push(id);
    else throw new GenerateError(path, `the model has no load case, combination or envelope \`${id}\``);
  });
  return [...new Set(out)];
}

/** Member ids of a group name or a single member id. */
export function membersOf(view: ResultsView, ref: string, scope: Scope, path: PropertyKey[]): ReadonlyArray<string> {
  const id = fillTemplate(ref, scope, path);
  const group = view.groups.get(id);
  if (group) return group;
  if (view.result.memberIds.includes(id)) return [id];
  throw new GenerateError(path, `the model has no member or group \`${id}\``);
}

function checkedNode(view: ResultsView, ref: string, scope: Scope, path: PropertyKey[]): string {
  const id = fillTemplate(ref, scope, path);
  if (!view.result.nodeIds.includes(id)) throw new GenerateError(path, `the model has no node \`${id}\``);
  return id;
}

/** Largest |value| of a quantity over members and results, with where; ties keep the first found. */
function maxAbs(
  view: ResultsView,
  members: ReadonlyArray<string>,
  unders: ReadonlyArray<string>,
  quantity: ResultQuantity,
  path: PropertyKey[],
) {
  let best: { value: number; where: Where } | null = null;
  const q = DIAGRAM_OF[quantity];
  for (const member of members) {
    for (const under of unders) {
      const d = view.diagram(member, under);
      const e = d.extremes[q];
      if (!e) throw new GenerateError(path, `member \`${member}\` has no ${quantity} (a frame member with I is needed)`);
      for (const candidate of [e.max, e.min]) {
        if (best === null || Math.abs(candidate.value) > Math.abs(best.value))
          best = { value: candidate.value, where: { member, x: candidate.x, under } };
      }
    }
  }
  return best!;
}

export function readExtract(view: ResultsView, definition: ExtractDefinition, scope: Scope, path: PropertyKey[]): ExtractValue {
  if ("reaction" in definition || "displacement" in definition) {
    const [key, spec, read] =
      "reaction" in definition
        ? (["reaction", definition.reaction, nodeReaction] as const)
        : (["displacement", definition.displacement, nodeDisplacement] as const);
    const node = checkedNode(view, spec.node, scope, [...path, key, "node"]);
    const unders = resultIds(view, definition.under, scope, [...path, "under"]);
    // The value of largest magnitude over the results read, with its sign and where.
    let best: ExtractValue | null = null;
    for (const under of unders) {
      const value = (read(view.result, node, under) as unknown as Record<string, number>)[spec.component];
      if (best === null || Math.abs(value) > Math.abs(best.value))
        best = { value, quantity: QUANTITY_OF[spec.component], where: { node, under } };
    }
    return best!;
  }
  if ("max_abs" in definition) {
    const members = membersOf(view, definition.members, scope, [...path, "members"]);
    const unders = resultIds(view, definition.under, scope, [...path, "under"]);
    const best = maxAbs(view, members, unders, definition.max_abs, path);
    // The largest magnitude, as the name says; the sign is of no use to a check against a limit.
    return { value: Math.abs(best.value), quantity: QUANTITY_OF[definition.max_abs], where: best.where };
  }
  const member = membersOf(view, definition.value_at.member, scope, [...path, "value_at", "member"]);
  if (member.length !== 1)
    throw new GenerateError([...path, "value_at", "member"], "a value at a position reads one member, not a group");
  const [under] = resultIds(view, definition.under, scope, [...path, "under"]);
  const d = view.diagram(member[0], under);
  const x = quantityAt(definition.value_at.at, "length", scope, [...path, "value_at", "at"]);
  if (x < 0 || x > d.length)
    throw new GenerateError(
      [...path, "value_at", "at"],
      `the position ${x} m lies outside member \`${member[0]}\` (length ${d.length} m)`,
    );
  const q = DIAGRAM_OF[definition.value_at.quantity];
  const value = d.valueAt(x)[q];
  if (value === undefined) throw new GenerateError(path, `member \`${member[0]}\` has no ${definition.value_at.quantity}`);
  return { value, quantity: QUANTITY_OF[definition.value_at.quantity], where: { member: member[0], x, under } };
}
