/**
 * Units and quantities of the standards, on a private mathjs instance.
 *
 * Expressions and typed inputs may use only the units the trade uses (TRADE_UNITS), never the whole of
 * mathjs's catalogue: there `h` is an hour, `A` an ampere and `L` a litre, and an input named like a unit
 * would silently change what a literal means (an input `N = 3` would turn `5 N` into 15). So an input,
 * derived value or loop variable may not be named like a trade unit, and a name that is neither a known
 * name nor a trade unit is an error, not a unit from elsewhere.
 *
 * US customary units are defined here from the exact definitions of the international foot (0.3048 m), the
 * avoirdupois pound (0.453 592 37 kg) and standard gravity (9.806 65 m/s²), so 1 lbf = 4.448 221 615 260 5 N
 * (NIST Special Publication 811, 2008 ed., Appendix B.8, "pound-force" and "kip"; B.9 notes the exact
 * definitions). mathjs's own `kip` (4448.2216 N) and `psi` are rounded; they are replaced.
 */
import { all, create, type MathJsInstance, type Unit } from "mathjs";

export const math: MathJsInstance = create(all, { number: "number" });

// Exact US customary force and stress units (NIST SP 811, 2008, Appendix B).
math.createUnit("kip", { definition: "1000 lbf", aliases: ["kips"] }, { override: true });
math.createUnit("psi", { definition: "1 lbf / in^2" }, { override: true });
math.createUnit("ksi", { definition: "1000 lbf / in^2" });
math.createUnit("psf", { definition: "1 lbf / ft^2" });
math.createUnit("pcf", { definition: "1 lbf / ft^3" });
math.createUnit("plf", { definition: "1 lbf / ft" });
math.createUnit("klf", { definition: "1000 lbf / ft" });

/** The units an expression or an input may name. Compound units are built from these (`kN/m`, `kip ft`). */
export const TRADE_UNITS: ReadonlySet<string> = new Set([
  // length
  "m",
  "mm",
  "cm",
  "km",
  "ft",
  "in",
  "inch",
  // force
  "N",
  "kN",
  "MN",
  "lbf",
  "kip",
  "kips",
  // stress and pressure
  "Pa",
  "kPa",
  "MPa",
  "GPa",
  "psi",
  "ksi",
  "psf",
  // force per length and per volume
  "plf",
  "klf",
  "pcf",
  // angle
  "rad",
  "deg",
  // mass (densities for self-weight)
  "kg",
]);

/** Physical quantities of inputs, derived values and results, each with the SI unit the engine takes. */
export const QUANTITIES = {
  length: "m",
  angle: "rad",
  force: "N",
  "force-per-length": "N/m",
  "force-per-area": "Pa",
  stress: "Pa",
  moment: "N m",
  area: "m^2",
  "second-moment-of-area": "m^4",
  "section-modulus": "m^3",
  density: "kg/m^3",
  "rotational-stiffness": "N m / rad",
  "translational-stiffness": "N/m",
  dimensionless: "",
  count: "",
} as const;
export type Quantity = keyof typeof QUANTITIES;

/** The SI unit of a quantity as a mathjs Unit of value 1, or null for dimensionless ones. */
export function siUnitOf(quantity: Quantity): Unit | null {
  return siUnitCached(quantity)?.clone() ?? null;
}

// Parsed once per quantity: parsing a unit text is the costliest step of reading a value, and a large frame's
// model reads thousands. Never handed out (siUnitOf gives a copy), so nothing can change them.
const siUnits = new Map<Quantity, { one: Unit | null; valueless: Unit | null }>();
function siUnitsOf(quantity: Quantity) {
  let hit = siUnits.get(quantity);
  if (!hit) {
    const text = QUANTITIES[quantity];
    hit = text === "" ? { one: null, valueless: null } : { one: math.unit(`1 ${text}`), valueless: math.unit(text) };
    siUnits.set(quantity, hit);
  }
  return hit;
}
function siUnitCached(quantity: Quantity): Unit | null {
  return siUnitsOf(quantity).one;
}

/** Whether a unit text names only trade units (with powers, products and quotients). */
export function unitNamesIn(unit: Unit): string[] {
  // The type declarations call the prefix a string; at run time it is an object with a name.
  return unit.units.map((u) => `${(u.prefix as unknown as { name: string }).name}${u.unit.name}`);
}

export function isTradeUnitText(text: string): boolean {
  try {
    const u = math.unit(`1 ${text}`);
    return unitNamesIn(u).every((name) => TRADE_UNITS.has(name));
  } catch {
    return false;
  }
}

export type Value = number | Unit | string | boolean;

export function isUnit(value: unknown): value is Unit {
  return math.isUnit(value);
}

/** Does a value have the dimension of a quantity? Dimensionless quantities take plain numbers (and unitless Units). */
export function hasDimensionOf(value: Value, quantity: Quantity): boolean {
  const si = siUnitCached(quantity);
  if (typeof value === "string" || typeof value === "boolean") return false;
  if (!isUnit(value)) return si === null;
  if (si === null) return value.dimensions.every((d) => d === 0);
  return value.equalBase(si);
}

/** The value in the SI unit of its quantity, as a plain number. */
export function toSI(value: Value, quantity: Quantity): number {
  if (typeof value === "number") return value;
  if (!isUnit(value)) throw new Error(`not a number: ${String(value)}`);
  const si = siUnitsOf(quantity).valueless;
  return si === null ? (value.toNumber() as number) : (value.toNumber(si as unknown as string) as number);
}

/** A plain SI number of a quantity as a mathjs value (a Unit, or the number for dimensionless ones). */
export function fromSI(value: number, quantity: Quantity): Value {
  const si = QUANTITIES[quantity];
  return si === "" ? value : math.unit(value, si);
}

/** Words for the dimension of a value, for error messages ("a force", "a length"…). */
export function describeDimension(value: Value): string {
  if (typeof value === "string") return "a text";
  if (typeof value === "boolean") return "a yes/no value";
  for (const quantity of Object.keys(QUANTITIES) as Quantity[]) {
    if (quantity === "count" || quantity === "stress") continue;
    if (hasDimensionOf(value, quantity)) return `a ${quantity.replaceAll("-", " ")} (${QUANTITIES[quantity] || "no unit"})`;
  }
  return isUnit(value) ? `a value in ${value.toSI().formatUnits()}` : "a number";
}
