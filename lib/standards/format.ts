/** Printing values the way engineers read them: a display unit and a number of significant figures. */
import { math, QUANTITIES, type Quantity, type Value } from "./units";

const SUPERSCRIPT: Record<string, string> = {
  "-": "⁻",
  "0": "⁰",
  "1": "¹",
  "2": "²",
  "3": "³",
  "4": "⁴",
  "5": "⁵",
  "6": "⁶",
  "7": "⁷",
  "8": "⁸",
  "9": "⁹",
};

/**
 * A number to `digits` significant figures, with no −0. Plain decimals from 10⁻⁴ up to 10⁹; beyond that the
 * engineers' form `1.23×10⁻⁵`, never `1.23e-5`.
 */
export function formatSignificant(value: number, digits: number): string {
  if (value === 0 || !Number.isFinite(value)) return value === 0 ? "0" : String(value);
  const rounded = Number(value.toPrecision(digits));
  const magnitude = Math.floor(Math.log10(Math.abs(rounded)));
  if (magnitude < -4 || magnitude >= 9) {
    const mantissa = (rounded / 10 ** magnitude).toFixed(Math.max(0, digits - 1));
    return `${mantissa}×10${String(magnitude).replace(/./g, (c) => SUPERSCRIPT[c])}`;
  }
  const text = rounded.toFixed(Math.max(0, digits - 1 - magnitude));
  return /^-0(\.0*)?$/.test(text) ? text.slice(1) : text;
}

/** `kN m` → `kN·m`, `m^4` → `m⁴`, `kN/m^2` → `kN/m²`. */
export function prettyUnit(unit: string): string {
  const superscript: Record<string, string> = { "2": "²", "3": "³", "4": "⁴", "-1": "⁻¹", "-2": "⁻²" };
  return unit
    .trim()
    .replace(/\s*\*\s*|\s+/g, "·")
    .replace(/\^(-?\d)/g, (_, p: string) => superscript[p] ?? `^${p}`);
}

/** An SI value of a quantity shown in a display unit, e.g. (36000, "moment", "kN m", 3) → "36.0 kN·m". */
export function formatQuantity(si: number, quantity: Quantity, unit: string | undefined, digits: number): string {
  const siUnit = QUANTITIES[quantity];
  if (siUnit === "" || !unit) return formatSignificant(si, digits);
  const shown = math.unit(si, siUnit).toNumber(unit);
  return `${formatSignificant(shown, digits)} ${prettyUnit(unit)}`;
}

/** Trailing zeros of a decimal part dropped: an input typed as `6 m` reads back as 6 m, not 6.000 m. */
export function trimZeros(text: string): string {
  return text.replace(/(\.\d*?)0+(?=×|$)/, "$1").replace(/\.(?=×|$)/, "");
}

/** A mathjs value in a display unit (or as it is, when it has no unit); `trim` drops trailing zeros. */
export function formatValue(value: Value, unit: string | undefined, digits: number, trim = false): string {
  if (typeof value === "string") return value;
  if (typeof value === "boolean") return value ? "yes" : "no";
  const number = (n: number) => (trim ? trimZeros(formatSignificant(n, digits)) : formatSignificant(n, digits));
  if (typeof value === "number") return number(value);
  const shown = unit ?? value.formatUnits();
  return `${number(value.toNumber(shown))} ${prettyUnit(shown)}`;
}
