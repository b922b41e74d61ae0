/** Printing values the way engineers read them: a display unit and a number of significant figures. */
import { math, QUANTITIES, type Quantity, type Value } from "./units";
import { formatSignificant } from "./significant";

export { formatSignificant };

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
