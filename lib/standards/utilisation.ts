// How a utilisation (demand over capacity) is shown: rounded up to two decimals, so 1.001 never shows as 1.00.
// On its own, without the expression machinery, so run lists in the browser can show it.

/** Utilisation rounded up to two decimals, for display. */
export function displayUtilisation(u: number): string {
  const up = Math.ceil(u * 100 - 1e-9) / 100;
  return up.toFixed(2);
}
