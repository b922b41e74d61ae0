// Showing stored results in SI or US customary units, each person's choice. Records hold SI values (and, for the
// standard's own values, a display string in the unit the standard chose); US customary display converts the SI
// value into the matching customary unit with the digits the standard asked for. Nothing stored changes.
//
// The factors are the exact definitions: 1 ft = 0.3048 m and 1 in = 0.0254 m (international yard and pound,
// 1959); 1 lbf = 4.4482216152605 N (standard gravity 9.80665 m/s² × 0.45359237 kg); 1 kip = 1000 lbf. The
// other factors are products and quotients of these (NIST Special Publication 811, 2008 ed., Appendix B).
import { formatSignificant } from "./significant";

export const DISPLAY_UNIT_SYSTEMS = ["si", "us"] as const;
export type DisplayUnits = (typeof DISPLAY_UNIT_SYSTEMS)[number];
export const DISPLAY_UNIT_LABELS: Record<DisplayUnits, string> = {
  si: "SI (kN, m, mm, MPa)",
  us: "US customary (kip, ft, in, ksi)",
};

const FT = 0.3048;
const IN = 0.0254;
const LBF = 4.4482216152605;
const KIP = 1000 * LBF;
const LB = 0.45359237;

/** A customary unit: how it is written and its size in SI base units (N, m, Pa, kg…). */
type Customary = { unit: string; si: number };

/** For each SI unit as the app writes it, the customary unit a US engineer reads it in. */
const US_FOR: Readonly<Record<string, Customary>> = {
  m: { unit: "ft", si: FT },
  mm: { unit: "in", si: IN },
  cm: { unit: "in", si: IN },
  km: { unit: "ft", si: FT },
  "m²": { unit: "ft²", si: FT ** 2 },
  "mm²": { unit: "in²", si: IN ** 2 },
  "cm²": { unit: "in²", si: IN ** 2 },
  "mm³": { unit: "in³", si: IN ** 3 },
  "cm³": { unit: "in³", si: IN ** 3 },
  "m³": { unit: "ft³", si: FT ** 3 },
  "mm⁴": { unit: "in⁴", si: IN ** 4 },
  "cm⁴": { unit: "in⁴", si: IN ** 4 },
  "m⁴": { unit: "ft⁴", si: FT ** 4 },
  N: { unit: "lbf", si: LBF },
  kN: { unit: "kip", si: KIP },
  MN: { unit: "kip", si: KIP },
  "N·m": { unit: "lbf·ft", si: LBF * FT },
  "kN·m": { unit: "kip·ft", si: KIP * FT },
  "N/m": { unit: "lbf/ft", si: LBF / FT },
  "kN/m": { unit: "kip/ft", si: KIP / FT },
  "N/mm": { unit: "kip/in", si: KIP / IN },
  Pa: { unit: "psf", si: LBF / FT ** 2 },
  kPa: { unit: "psf", si: LBF / FT ** 2 },
  "kN/m²": { unit: "psf", si: LBF / FT ** 2 },
  MPa: { unit: "ksi", si: KIP / IN ** 2 },
  GPa: { unit: "ksi", si: KIP / IN ** 2 },
  "N/mm²": { unit: "ksi", si: KIP / IN ** 2 },
  "kg/m³": { unit: "lb/ft³", si: LB / FT ** 3 },
  "kN·m/rad": { unit: "kip·ft/rad", si: KIP * FT },
  "kN/mm": { unit: "kip/in", si: KIP / IN },
};

/** Significant digits of a written number ("45.0" → 3, "0.0120" → 3, "1200" → 4); at least 2, at most 6. */
function digitsOf(number: string): number {
  const mantissa = number.replace(/[eE×].*$/, "").replace(/[^0-9]/g, "");
  const significant = mantissa.replace(/^0+/, "");
  return Math.min(6, Math.max(2, significant.length));
}

/**
 * A value as a person reads it: `display` as the standard wrote it for SI; for US customary, the SI value in the
 * customary unit matching the display's unit, to the display's digits. A value without a unit, or in a unit with
 * no customary counterpart (rad, a ratio), is shown as written.
 */
export function showValue(si: number, display: string, units: DisplayUnits): string {
  if (units === "si" || !Number.isFinite(si)) return display;
  const space = display.indexOf(" ");
  if (space < 0) return display;
  const us = US_FOR[display.slice(space + 1).trim()];
  if (!us) return display;
  return `${formatSignificant(si / us.si, digitsOf(display.slice(0, space)))} ${us.unit}`;
}

/** The unit and the factor from SI that results tables and diagrams use for a kind of value. */
export type ResultUnit = { unit: string; factor: number };
export type ResultKind = "force" | "moment" | "displacement" | "stress" | "length";

const RESULT_UNITS: Record<DisplayUnits, Record<ResultKind, ResultUnit>> = {
  si: {
    force: { unit: "kN", factor: 1e-3 },
    moment: { unit: "kN·m", factor: 1e-3 },
    displacement: { unit: "mm", factor: 1e3 },
    stress: { unit: "MPa", factor: 1e-6 },
    length: { unit: "m", factor: 1 },
  },
  us: {
    force: { unit: "kip", factor: 1 / KIP },
    moment: { unit: "kip·ft", factor: 1 / (KIP * FT) },
    displacement: { unit: "in", factor: 1 / IN },
    stress: { unit: "ksi", factor: IN ** 2 / KIP },
    length: { unit: "ft", factor: 1 / FT },
  },
};

export function resultUnit(kind: ResultKind, units: DisplayUnits): ResultUnit {
  return RESULT_UNITS[units][kind];
}
