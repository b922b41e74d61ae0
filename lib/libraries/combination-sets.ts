/**
 * A load-combination set turned into the engine's combinations for one model. The set's factors are per load
 * kind (D, L, W…); the model's load cases are each of one kind. The rules:
 *
 *   add           every case of the kind takes the kind's factor in the same combination (two dead-load
 *                 cases, the frame's and the cladding's, act together)
 *   alternatives  each case of the kind makes its own combination (wind from the left, wind from the right);
 *                 with two such kinds in one combination, every pairing
 *   absent kinds  a kind the model has no case of drops out of every combination; a combination whose
 *                 leading action is absent is left out (what remains is a weaker copy of another)
 *   duplicates    a combination with the same factor on every case as one before it is left out, and the
 *                 result says which one it repeats (2-S and 2-R when the model has no snow or rain)
 *   leave out     on request, each combination also without its accompanying variable actions, one or more at
 *                 a time (ASCE/SEI 7-16 §2.3.1 and §2.4.1: effects of loads not acting shall be considered;
 *                 EN 1990 6.4.3.2: a favourable variable action is taken as zero). The leading action and the
 *                 permanent actions are never left out.
 *
 * Ids: the set's combination id, then `:case` for each alternatives kind with more than one case in the model,
 * then `:no-K` for each kind left out — "4-Lr:W2:no-L" — after the prefix asked for, if any. Names: the set's
 * label with the cases and the kinds left out in words.
 */
import type { CombinationSetEntry } from "./document";

/** A combination in the engine's form (lib/engine's Combination: a named factor per load case id). */
export interface EngineCombination {
  id: string;
  name: string;
  factors: Record<string, number>;
}

/** Beyond this many combinations from one set, the model's cases are surely assigned wrongly. */
export const MAX_EXPANDED_COMBINATIONS = 2000;

export interface ExpandOptions {
  /** Also give each combination without its accompanying variable actions (see the file's comment). */
  leaveOutAccompanying?: boolean;
  /**
   * Put before every id ("ULS " gives "ULS 2-Lr"), so two sets' combinations can sit in one model — ASCE's
   * strength and allowable stress sets both have a combination "1" — and none takes a load case's id.
   */
  idPrefix?: string;
}

/** Where an engine combination came from. */
export interface CombinationOrigin {
  /** The engine combination's id. */
  id: string;
  /** The set's combination it was made from. */
  combination: string;
  /** For each alternatives kind with a case in the combination, that case. */
  alternatives: Record<string, string>;
  /** Kinds of the set's combination with no case in the model. */
  absent: string[];
  /** Accompanying kinds left out on request. */
  leftOut: string[];
}

export interface DroppedCombination {
  /** The id the combination would have had. */
  id: string;
  /** The set's combination. */
  combination: string;
  reason: "leading-absent" | "duplicate" | "no-cases";
  /** For a duplicate: the combination kept in its place. */
  duplicateOf?: string;
  message: string;
}

export interface ExpansionProblem {
  /** The load case the problem is about, if one. */
  loadCase: string | null;
  message: string;
}

export type ExpandCombinationSetResult =
  | {
      ok: true;
      /** In the engine's form, in the set's order. */
      combinations: EngineCombination[];
      /** One per combination, same order. */
      origins: CombinationOrigin[];
      dropped: DroppedCombination[];
      /** The set's kinds the model has no case of. */
      absentKinds: string[];
    }
  | { ok: false; problems: ExpansionProblem[] };

type Kind = CombinationSetEntry["loadKinds"][number];

function listInWords(items: string[]): string {
  if (items.length <= 1) return items.join("");
  return `${items.slice(0, -1).join(", ")} and ${items[items.length - 1]}`;
}

/** Every subset of `items`, smallest first, each in the items' order. */
function subsets<T>(items: T[]): T[][] {
  const all: T[][] = [];
  for (let mask = 0; mask < 1 << items.length; mask++) all.push(items.filter((_, i) => mask & (1 << i)));
  return all.sort((a, b) => a.length - b.length);
}

/** Every pick of one case per alternatives kind, the kinds in the set's order, cases in the model's. */
function pairings(kinds: Kind[], casesOf: Map<string, string[]>): Record<string, string>[] {
  let picks: Record<string, string>[] = [{}];
  for (const kind of kinds)
    picks = picks.flatMap((pick) => (casesOf.get(kind.id) ?? []).map((loadCase) => ({ ...pick, [kind.id]: loadCase })));
  return picks;
}

/** A factor table's identity, for finding duplicates: cases sorted, factors to 12 significant digits. */
function factorKey(factors: Record<string, number>): string {
  return Object.keys(factors)
    .sort()
    .map((loadCase) => `${JSON.stringify(loadCase)}=${factors[loadCase].toPrecision(12)}`)
    .join(",");
}

/**
 * The engine's combinations of a set for a model whose load cases are of the kinds given
 * ({ G1: "D", Q1: "L", W1: "W", W2: "W" }). Nothing here throws; a case of a kind the set does not know is
 * a problem naming the case and the set's kinds.
 */
export function expandCombinationSet(
  set: CombinationSetEntry,
  caseKinds: Readonly<Record<string, string>>,
  options: ExpandOptions = {},
): ExpandCombinationSetResult {
  const kinds = new Map(set.loadKinds.map((kind) => [kind.id, kind]));
  const known = listInWords(set.loadKinds.map((kind) => kind.id));
  const problems: ExpansionProblem[] = [];
  const casesOf = new Map<string, string[]>();
  const entries = caseKinds && typeof caseKinds === "object" ? Object.entries(caseKinds) : [];
  if (entries.length === 0) problems.push({ loadCase: null, message: "The model has no load cases to combine." });
  for (const [loadCase, kind] of entries) {
    if (typeof kind !== "string" || !kinds.has(kind)) {
      problems.push({
        loadCase,
        message: `Load case “${loadCase}” is of kind “${String(kind)}”, which the set “${set.key}” does not know; its load kinds are ${known}.`,
      });
      continue;
    }
    casesOf.set(kind, [...(casesOf.get(kind) ?? []), loadCase]);
  }
  if (problems.length > 0) return { ok: false, problems };

  const absentKinds = set.loadKinds.filter((kind) => !casesOf.has(kind.id)).map((kind) => kind.id);
  const combinations: EngineCombination[] = [];
  const origins: CombinationOrigin[] = [];
  const dropped: DroppedCombination[] = [];
  const seen = new Map<string, string>();
  let made = 0;

  for (const combination of set.combinations) {
    const inSet = Object.keys(combination.factors);
    const absent = inSet.filter((kind) => !casesOf.has(kind));
    const present = set.loadKinds.filter((kind) => Object.hasOwn(combination.factors, kind.id) && casesOf.has(kind.id));
    if (combination.leading !== undefined && !casesOf.has(combination.leading)) {
      dropped.push({
        id: (options.idPrefix ?? "") + combination.id,
        combination: combination.id,
        reason: "leading-absent",
        message: `${combination.id} (${combination.label}) is left out: it is led by ${combination.leading}, and the model has no ${combination.leading} case.`,
      });
      continue;
    }
    const optional = options.leaveOutAccompanying
      ? present.filter((kind) => kind.action === "variable" && kind.id !== combination.leading)
      : [];
    for (const leftOutKinds of subsets(optional)) {
      const leftOut = new Set(leftOutKinds.map((kind) => kind.id));
      const acting = present.filter((kind) => !leftOut.has(kind.id));
      const alternativeKinds = acting.filter((kind) => kind.cases === "alternatives");
      for (const pick of pairings(alternativeKinds, casesOf)) {
        made += 1;
        if (made > MAX_EXPANDED_COMBINATIONS)
          return {
            ok: false,
            problems: [
              {
                loadCase: null,
                message: `The set “${set.key}” would give more than ${MAX_EXPANDED_COMBINATIONS} combinations for these load cases; give fewer cases of the alternative kinds, or check that each case's kind is right.`,
              },
            ],
          };
        // fromEntries, not assignment, so a case called "__proto__" is a case like any other.
        const factors: Record<string, number> = Object.fromEntries(
          entries
            .filter(
              ([loadCase, kind]) =>
                acting.some((k) => k.id === kind) && (kinds.get(kind)!.cases === "add" || pick[kind] === loadCase),
            )
            .map(([loadCase, kind]) => [loadCase, combination.factors[kind]]),
        );
        const shown = alternativeKinds.filter((kind) => casesOf.get(kind.id)!.length > 1).map((kind) => pick[kind.id]);
        const id = (options.idPrefix ?? "") + [combination.id, ...shown, ...[...leftOut].map((kind) => `no-${kind}`)].join(":");
        const words = [
          ...(shown.length > 0 ? [shown.join(", ")] : []),
          ...(leftOut.size > 0 ? [`without ${listInWords([...leftOut])}`] : []),
        ];
        const name = words.length > 0 ? `${combination.label} (${words.join("; ")})` : combination.label;
        if (Object.keys(factors).length === 0) {
          dropped.push({
            id,
            combination: combination.id,
            reason: "no-cases",
            message: `${id} (${combination.label}) is left out: the model has no case of any of its load kinds.`,
          });
          continue;
        }
        const key = factorKey(factors);
        const first = seen.get(key);
        if (first !== undefined) {
          dropped.push({
            id,
            combination: combination.id,
            reason: "duplicate",
            duplicateOf: first,
            message: `${id} (${name}) is left out: for these load cases it is the same as ${first}.`,
          });
          continue;
        }
        seen.set(key, id);
        combinations.push({ id, name, factors });
        origins.push({ id, combination: combination.id, alternatives: pick, absent, leftOut: [...leftOut] });
      }
    }
  }
  // The engine looks results up by id across cases and combinations, and refuses a model where they collide.
  const clashes = combinations.filter((c) => Object.hasOwn(caseKinds, c.id));
  if (clashes.length > 0)
    return {
      ok: false,
      problems: clashes.map((c) => ({
        loadCase: c.id,
        message: `Load case “${c.id}” has the id of one of the set's combinations; rename the load case, or give the combinations a prefix.`,
      })),
    };
  if (combinations.length === 0)
    return {
      ok: false,
      problems: [{ loadCase: null, message: `None of the combinations of “${set.key}” applies to these load cases.` }],
    };
  return { ok: true, combinations, origins, dropped, absentKinds };
}

/** As expandCombinationSet, throwing the problems as one sentence per line. */
export function expandCombinationSetOrThrow(
  set: CombinationSetEntry,
  caseKinds: Readonly<Record<string, string>>,
  options: ExpandOptions = {},
): Extract<ExpandCombinationSetResult, { ok: true }> {
  const result = expandCombinationSet(set, caseKinds, options);
  if (!result.ok) throw new Error(result.problems.map((p) => p.message).join("\n"));
  return result;
}
