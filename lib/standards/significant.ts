// Significant figures the way engineers write them, on their own (no unit machinery), for pages and lists in the
// browser as much as for the server.

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
