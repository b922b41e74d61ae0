// A run form's own reading of "number + unit" (`6 m`, `19.7 ft`, `12 kN/m`), so that fields can show the converted
// value while typing without the browser loading mathjs: the units offered and their factors come from the
// server with the form. The server reads every value again with the full unit system when the run is made.

/** A number, optionally signed and with a decimal part and exponent, then an optional unit (as lib/standards reads it). */
const NUMBER_AND_UNIT = /^\s*([+-]?(?:\d+(?:\.\d*)?|\.\d+)(?:[eE][+-]?\d+)?)\s*(.*?)\s*$/;

export type QuantityReading =
  { ok: true; number: number; unit: string; inOwnUnit: number | null } | { ok: false; message: string };

const normalise = (unit: string) =>
  unit
    .replace(/\s*\*\s*/g, " ")
    .replace(/\s+/g, " ")
    .trim();

/**
 * Reads a typed value against the units a field offers (text → factor to its own unit). `inOwnUnit` is null for a
 * unit the form does not list: the server may still know it, and says so when the run is made.
 */
export function readQuantityText(text: string, units: Readonly<Record<string, number>>, ownUnit?: string): QuantityReading {
  const match = NUMBER_AND_UNIT.exec(text);
  if (!match) return { ok: false, message: ownUnit ? `Enter a number with its unit, e.g. 6 ${ownUnit}.` : "Enter a number." };
  const number = Number(match[1]);
  if (!Number.isFinite(number)) return { ok: false, message: "Enter a finite number." };
  const unit = normalise(match[2]);
  if (unit === "") return { ok: true, number, unit: ownUnit ?? "", inOwnUnit: number };
  if (!ownUnit && Object.keys(units).length === 0)
    return { ok: false, message: "This value takes a plain number, without a unit." };
  const factor = Object.entries(units).find(([name]) => normalise(name) === unit)?.[1];
  return { ok: true, number, unit, inOwnUnit: factor === undefined ? null : number * factor };
}

/** A number as the form shows a converted value: up to 4 significant figures, no exponent for everyday sizes. */
export function formatConverted(value: number): string {
  if (value === 0) return "0";
  const abs = Math.abs(value);
  if (abs >= 1e-3 && abs < 1e7) return String(Number(value.toPrecision(4)));
  return value.toExponential(3);
}
