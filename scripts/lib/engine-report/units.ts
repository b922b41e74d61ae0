/**
 * Units for display. The engine works in SI (N, m, Pa); the report converts at the last moment. Each unit is
 * given by its size in SI. The US customary sizes are exact by definition: 1 ft = 0.3048 m, 1 in = 0.0254 m,
 * 1 lbf = 4.4482216152605 N (NIST SP 811 (2008), Appendix B), and 1 kip = 1000 lbf.
 */

export interface Unit {
  readonly symbol: string;
  /** How many SI units (N, m, N·m) one of this unit is. */
  readonly size: number;
  /** Spelled out where the symbol alone could be misread ("deflections in"). */
  readonly name?: string;
}

export interface UnitSystem {
  /** As typed after --units. */
  readonly name: string;
  readonly force: Unit;
  /** Coordinates and positions along members. */
  readonly length: Unit;
  readonly moment: Unit;
  /** Deflections: mm in SI practice, inches in US practice. */
  readonly deflection: Unit;
  /** Where the conversion factors come from, for the report's header; none for SI. */
  readonly conversions?: string;
}

const FOOT = 0.3048;
const INCH = 0.0254;
const POUND_FORCE = 4.4482216152605;
const KIP = 1000 * POUND_FORCE;

const N = { symbol: "N", size: 1 };
const KN = { symbol: "kN", size: 1e3 };
const M = { symbol: "m", size: 1 };
const MM = { symbol: "mm", size: 1e-3 };

export const UNIT_SYSTEMS: ReadonlyArray<UnitSystem> = [
  { name: "N,m", force: N, length: M, moment: { symbol: "N·m", size: 1 }, deflection: MM },
  { name: "kN,m", force: KN, length: M, moment: { symbol: "kN·m", size: 1e3 }, deflection: MM },
  // Drawings in mm still state moments in kN·m; kN·mm numbers are a thousand times larger than anyone expects.
  { name: "kN,mm", force: KN, length: MM, moment: { symbol: "kN·m", size: 1e3 }, deflection: MM },
  {
    name: "kip,ft",
    force: { symbol: "kip", size: KIP },
    length: { symbol: "ft", size: FOOT },
    moment: { symbol: "kip·ft", size: KIP * FOOT },
    deflection: { symbol: "in", size: INCH, name: "inches" },
    conversions:
      "1 ft = 0.3048 m, 1 in = 0.0254 m, 1 kip = 1000 lbf = 4448.2216152605 N (exact by definition, NIST SP 811 (2008), Appendix B)",
  },
];

export const DEFAULT_UNITS = UNIT_SYSTEMS[0];

/** An SI value in the given unit. */
export function inUnit(siValue: number, unit: Unit): number {
  return siValue / unit.size;
}

export function unitSystemNames(): string {
  return UNIT_SYSTEMS.map((u) => u.name).join(", ");
}

/** The unit system named after --units (case and spaces aside), or a message listing the valid ones. */
export function parseUnitSystem(text: string): { ok: true; units: UnitSystem } | { ok: false; message: string } {
  const wanted = text.replace(/\s+/g, "").toLowerCase();
  const units = UNIT_SYSTEMS.find((u) => u.name.toLowerCase() === wanted || (u.name === "kip,ft" && wanted === "kips,ft"));
  if (units) return { ok: true, units };
  return { ok: false, message: `Unknown unit set "${text}"; the valid ones are ${unitSystemNames()} (default N,m)` };
}
