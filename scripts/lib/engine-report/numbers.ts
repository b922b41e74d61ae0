/**
 * Numbers as an engineer reads them: four significant figures, and floating-point noise (a value below 1e-9
 * of the largest of its kind, such as 1.2e-17 kN beside 30 kN) shown as 0 rather than as a number that
 * suggests a force exists. The engine's own values are untouched; this is display only.
 */

export const SIGNIFICANT_FIGURES = 4;
/** A value smaller than this fraction of the largest of its kind is rounding noise. */
export const NOISE_RATIO = 1e-9;

/** v rounded to `digits` significant figures (74999.99999999999 → 75000). */
export function roundSignificant(v: number, digits = SIGNIFICANT_FIGURES): number {
  if (v === 0 || !Number.isFinite(v)) return v === 0 ? 0 : v;
  return Number(v.toPrecision(digits));
}

/** Whether v is noise beside the largest value of its kind (`scale`). */
export function isNoise(v: number, scale: number): boolean {
  return v === 0 || Math.abs(v) < NOISE_RATIO * scale;
}

/** 1.235e-4 rather than 1.235e-4 with a plus sign or a padded exponent. */
function exponential(v: number, digits: number): string {
  return v.toExponential(digits - 1).replace("e+", "e");
}

/**
 * Four significant figures; trailing zeros kept below 10⁴ (they state the precision: 75.00), whole numbers from
 * 10⁴ to 10⁹ (75000), powers of ten outside 1e-3 … 1e9. Noise beside `scale` prints as 0.
 */
export function formatNumber(v: number, scale = 0, digits = SIGNIFICANT_FIGURES): string {
  if (!Number.isFinite(v)) return String(v);
  if (isNoise(v, scale)) return "0";
  const r = roundSignificant(v, digits);
  const a = Math.abs(r);
  if (a >= 1e9 || a < 1e-3) return exponential(r, digits);
  if (a >= 10 ** digits) return r.toFixed(0);
  return r.toPrecision(digits);
}

/** A residual is noise by design, so it is shown as such, to two figures (3.6e-15), never rounded away. */
export function formatResidual(v: number): string {
  if (v === 0) return "0";
  return exponential(v, 2);
}
