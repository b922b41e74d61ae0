/**
 * Design checks: demand against capacity, with the utilisation and where it governs.
 *
 * A check with `for_each` runs for every member of a group under every result listed, at every section the
 * diagrams can govern at (the sampled points, both sides of each load discontinuity, and the exact extremes of
 * N, V and M), on the forces acting there together — N with the M beside it, for interaction — and with that
 * member's own length and properties. It reports the governing member, result and position; it never pools
 * maxima from different places.
 *
 * The utilisation is demand ÷ capacity for `<=` and capacity ÷ demand for `>=`; it passes at 1 or less and is
 * shown rounded up (1.004 shows as 1.01 and fails; never "1.00 FAIL") — common practice for design checks.
 */
import type { CheckDefinition } from "./definition";
import { compileNumeric, ExpressionError, type NumericExpression, type SiScope, type SiValue } from "./expressions";
import { evaluateAt, GenerateError } from "./generate";
import { displayUtilisation } from "./utilisation";
import { membersOf, resultIds, type ResultsView, type Where } from "./extracts";
import { describeDimension, hasDimensionOf, isUnit, math, type Value } from "./units";

/** Names a `for_each` check's expressions see besides the standard's own: the section's forces and the member. */
export const SECTION_NAMES = ["N", "V", "M", "x", "L_member", "E_member", "A_member", "I_member"] as const;

export interface CheckOutcome {
  readonly demand: Value;
  readonly capacity: Value;
  readonly utilisation: number;
  readonly pass: boolean;
  /** Where it governs (for_each checks only). */
  readonly where?: Where;
  /** How many member sections × results were checked (for_each checks only). */
  readonly sectionsChecked?: number;
}

type Scope = ReadonlyMap<string, Value>;

export { displayUtilisation };

function utilisationOf(definition: CheckDefinition, demand: Value, capacity: Value, path: PropertyKey[]): number {
  if (typeof demand === "string" || typeof demand === "boolean" || typeof capacity === "string" || typeof capacity === "boolean")
    throw new GenerateError(path, "demand and capacity must be numbers or quantities");
  const sameKind = isUnit(demand) ? isUnit(capacity) && demand.equalBase(capacity) : hasDimensionOf(capacity, "dimensionless");
  if (!sameKind)
    throw new GenerateError(
      path,
      `the demand is ${describeDimension(demand)} but the capacity is ${describeDimension(capacity)}; they must be of the same kind`,
    );
  const d = isUnit(demand) ? (demand.toSI().toNumber() as number) : demand;
  const c = isUnit(capacity) ? (capacity.toSI().toNumber() as number) : (capacity as number);
  const [num, den] = definition.relation === "<=" ? [d, c] : [c, d];
  if (den === 0) {
    if (num === 0) return 0;
    throw new GenerateError(
      path,
      `the ${definition.relation === "<=" ? "capacity" : "demand"} is zero: the utilisation is unbounded`,
    );
  }
  const u = num / den;
  if (u < 0)
    throw new GenerateError(path, "the demand and capacity have opposite signs; write the demand as a magnitude, e.g. abs(M)");
  return u;
}

export function runCheck(view: ResultsView | null, definition: CheckDefinition, scope: Scope, path: PropertyKey[]): CheckOutcome {
  if (!definition.for_each) {
    const demand = evaluateAt(definition.demand, scope, [...path, "demand"]);
    const capacity = evaluateAt(definition.capacity, scope, [...path, "capacity"]);
    const utilisation = utilisationOf(definition, demand, capacity, path);
    return { demand, capacity, utilisation, pass: utilisation <= 1 };
  }
  if (!view) throw new GenerateError(path, "a check for each member needs the analysis");
  const members = membersOf(view, definition.for_each.members, scope, [...path, "for_each", "members"]);
  const unders = resultIds(view, definition.for_each.under, scope, [...path, "for_each", "under"]);
  // Every section of every member under every result: the dimensions are checked once with units (the first
  // section), then the sections run on plain SI numbers, and the governing one is evaluated again with units
  // for display. Same arithmetic, many times faster.
  const known = new Set([...scope.keys(), ...SECTION_NAMES]);
  const numericDemand = numeric(definition.demand, known, [...path, "demand"]);
  const numericCapacity = numeric(definition.capacity, known, [...path, "capacity"]);
  const siScope = new Map<string, SiValue>();
  for (const [name, value] of scope) siScope.set(name, isUnit(value) ? (value.toSI().toNumber() as number) : value);
  let best: { utilisation: number; member: string; under: string; x: number; side: "left" | "right" } | null = null;
  let dimensionsChecked = false;
  let sections = 0;
  // One section record and one scope, refilled at each section: tens of thousands of sections in a large frame,
  // and allocating for each one made the collector the largest cost.
  const section: Record<(typeof SECTION_NAMES)[number], number> = {
    N: 0,
    V: 0,
    M: 0,
    x: 0,
    L_member: 0,
    E_member: 0,
    A_member: 0,
    I_member: 0,
  };
  const local: SiScope = {
    get: (name) => (Object.hasOwn(section, name) ? section[name as keyof typeof section] : siScope.get(name)),
  };
  const propertiesOf = memberPropertiesOf(view);
  // A side that names nothing of the section (a capacity such as `M_bm`, or `1`) is the same at every section.
  const bySection = (e: NumericExpression) => e.names.some((name) => (SECTION_NAMES as ReadonlyArray<string>).includes(name));
  const fixedDemand = bySection(numericDemand) ? null : numericValue(numericDemand, local, path, "demand");
  const fixedCapacity = bySection(numericCapacity) ? null : numericValue(numericCapacity, local, path, "capacity");
  for (const member of members) {
    const props = propertiesOf(member);
    section.E_member = props.E;
    section.A_member = props.A;
    section.I_member = props.I ?? 0;
    for (const under of unders) {
      const d = view.forces(member, under);
      section.L_member = d.length;
      const at = (x: number, side: "left" | "right", N: number, V: number, M: number) => {
        section.N = N;
        section.V = V;
        section.M = M;
        section.x = x;
        if (!dimensionsChecked) {
          const withUnits = sectionScope(scope, { N, V, M }, x, d.length, props);
          utilisationOf(
            definition,
            evaluateAt(definition.demand, withUnits, [...path, "demand"]),
            evaluateAt(definition.capacity, withUnits, [...path, "capacity"]),
            path,
          );
          dimensionsChecked = true;
        }
        const demand = fixedDemand ?? numericDemand.evaluateNumber(local) ?? numericValue(numericDemand, local, path, "demand");
        const capacity =
          fixedCapacity ?? numericCapacity.evaluateNumber(local) ?? numericValue(numericCapacity, local, path, "capacity");
        const utilisation = utilisationOf(definition, demand, capacity, path);
        sections++;
        if (best === null || utilisation > best.utilisation) best = { utilisation, member, under, x, side };
      };
      // The sampled sections (both sides of each load discontinuity among them), read from the diagram's samples.
      const { x: xs, N, V, M } = d.samples;
      for (let k = 0; k < xs.length; k++) {
        const side = k > 0 && xs[k - 1] === xs[k] ? "right" : k + 1 < xs.length && xs[k + 1] === xs[k] ? "left" : "right";
        at(xs[k], side, N[k], V[k], M[k]);
      }
      // Both sides of the exact extremes of N, V and M, unless already sampled there (the ends, a load's edge).
      for (const q of ["N", "V", "M"] as const)
        for (const e of [d.extremes[q].max, d.extremes[q].min])
          if (!xs.includes(e.x))
            for (const side of ["left", "right"] as const) {
              const f = d.forcesAt(e.x, side);
              at(e.x, side, f.N, f.V, f.M);
            }
    }
  }
  const g = best!;
  const d = view.forces(g.member, g.under);
  const withUnits = sectionScope(scope, d.forcesAt(g.x, g.side), g.x, d.length, propertiesOf(g.member));
  const demand = evaluateAt(definition.demand, withUnits, [...path, "demand"]);
  const capacity = evaluateAt(definition.capacity, withUnits, [...path, "capacity"]);
  const utilisation = utilisationOf(definition, demand, capacity, path);
  return {
    demand,
    capacity,
    utilisation,
    pass: utilisation <= 1,
    where: { member: g.member, x: g.x, under: g.under },
    sectionsChecked: sections,
  };
}

/** The standard's scope plus a section's forces and its member, as quantities with units. */
function sectionScope(
  scope: Scope,
  f: { N: number; V: number; M: number },
  x: number,
  length: number,
  props: { E: number; A: number; I?: number },
): Map<string, Value> {
  const local = new Map(scope);
  local.set("N", math.unit(f.N, "N"));
  local.set("V", math.unit(f.V, "N"));
  local.set("M", math.unit(f.M, "N m"));
  local.set("x", math.unit(x, "m"));
  local.set("L_member", math.unit(length, "m"));
  local.set("E_member", math.unit(props.E, "Pa"));
  local.set("A_member", math.unit(props.A, "m^2"));
  local.set("I_member", math.unit(props.I ?? 0, "m^4"));
  return local;
}

function numeric(source: string, known: ReadonlySet<string>, path: PropertyKey[]): NumericExpression {
  try {
    return compileNumeric(source, known);
  } catch (error) {
    if (error instanceof ExpressionError) throw new GenerateError(path, error.message);
    throw error;
  }
}

function numericValue(expression: NumericExpression, scope: SiScope, path: PropertyKey[], part: "demand" | "capacity"): Value {
  try {
    return expression.evaluate(scope);
  } catch (error) {
    if (error instanceof ExpressionError) throw new GenerateError([...path, part], error.message);
    throw error;
  }
}

/** A look-up of members' E, A and I by id (the model's list, indexed once per check). */
function memberPropertiesOf(view: ResultsView): (member: string) => { E: number; A: number; I?: number } {
  const byId = new Map((view.model.members ?? []).map((m) => [m.id, m]));
  return (member) => {
    const m = byId.get(member);
    if (!m) throw new Error(`no member ${member}`);
    return { E: m.E, A: m.A, ...(m.I !== undefined ? { I: m.I } : {}) };
  };
}
