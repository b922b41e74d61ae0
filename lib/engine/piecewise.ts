/**
 * Piecewise polynomials on [0, L] for the diagrams along a member. Each segment k stores coefficients in the
 * local variable t = x − breaks[k] (ascending powers), which keeps them well conditioned on long members.
 * Span loads are at most linear, so degrees stay ≤ 5 (deflection under a linearly varying load).
 */

export const MAX_DEGREE = 5;
const NC = MAX_DEGREE + 1;

export interface Piecewise {
  readonly breaks: Float64Array;
  /** Segment k: coefficients [c0..c5] of Σ c_p t^p, t = x − breaks[k]. */
  readonly coeffs: Float64Array[];
}

export function zeroPiecewise(breaks: Float64Array): Piecewise {
  return { breaks, coeffs: Array.from({ length: breaks.length - 1 }, () => new Float64Array(NC)) };
}

function horner(c: Float64Array, t: number): number {
  let v = 0;
  for (let p = NC - 1; p >= 0; p--) v = v * t + c[p];
  return v;
}

/** Segment containing x; at a break the segment to its right (left at the last break). */
export function segmentOf(breaks: Float64Array, x: number, side: "left" | "right" = "right"): number {
  const S = breaks.length - 1;
  let lo = 0;
  let hi = S - 1;
  while (lo < hi) {
    const mid = (lo + hi + 1) >> 1;
    if (side === "right" ? breaks[mid] <= x : breaks[mid] < x) lo = mid;
    else hi = mid - 1;
  }
  return lo;
}

export function evaluate(pp: Piecewise, x: number, side: "left" | "right" = "right"): number {
  const k = segmentOf(pp.breaks, x, side);
  return horner(pp.coeffs[k], x - pp.breaks[k]);
}

/**
 * F(x) = initial + ∫₀ˣ P, plus a step of jumps[k] at breaks[k] (jumps[0] adds to the initial value).
 * This is how point loads (steps in V) and couples (steps in M) enter.
 */
export function integrate(pp: Piecewise, initial: number, jumps?: Float64Array): Piecewise {
  const out = zeroPiecewise(pp.breaks);
  let start = initial;
  for (let k = 0; k < pp.coeffs.length; k++) {
    if (jumps) start += jumps[k];
    const c = pp.coeffs[k];
    const o = out.coeffs[k];
    o[0] = start;
    for (let p = 0; p < NC - 1; p++) o[p + 1] = c[p] / (p + 1);
    // The highest coefficient of P is dropped: degrees here never exceed MAX_DEGREE − 1 before integration.
    start = horner(o, pp.breaks[k + 1] - pp.breaks[k]);
  }
  return out;
}

/** Σ scale_i · pp_i over pieces sharing the same breaks. */
export function combine(terms: ReadonlyArray<[Piecewise, number]>, breaks: Float64Array): Piecewise {
  const out = zeroPiecewise(breaks);
  for (const [pp, s] of terms) {
    pp.coeffs.forEach((c, k) => {
      for (let p = 0; p < NC; p++) out.coeffs[k][p] += s * c[p];
    });
  }
  return out;
}

/** A single polynomial in x (ascending coefficients) re-expressed on every segment. */
export function fromGlobalPolynomial(a: ReadonlyArray<number>, breaks: Float64Array): Piecewise {
  const out = zeroPiecewise(breaks);
  out.coeffs.forEach((o, k) => {
    // Taylor shift: coefficient p of P(x_k + t) is Σ_q a_q C(q, p) x_k^(q−p).
    const x0 = breaks[k];
    for (let q = 0; q < a.length; q++) {
      let binom = 1;
      for (let p = 0; p <= q; p++) {
        o[p] += a[q] * binom * x0 ** (q - p);
        binom = (binom * (q - p)) / (p + 1);
      }
    }
  });
  return out;
}

function hornerArray(c: ReadonlyArray<number>, t: number): number {
  let v = 0;
  for (let p = c.length - 1; p >= 0; p--) v = v * t + c[p];
  return v;
}

/** Root of c on [a, b] where it changes sign, by bisection to full precision. */
function bisect(c: ReadonlyArray<number>, a: number, b: number, fa: number): number {
  for (let it = 0; it < 200; it++) {
    const m = (a + b) / 2;
    if (m === a || m === b) break;
    const fm = hornerArray(c, m);
    if (fm === 0) return m;
    if (fa * fm < 0) b = m;
    else {
      a = m;
      fa = fm;
    }
  }
  return (a + b) / 2;
}

/**
 * Real roots of Σ c_p t^p in (0, h), ascending. Up to quadratics in closed form; higher degrees split [0, h]
 * at the roots of the derivative (found the same way), so each piece is monotone and holds at most one root.
 */
function rootsIn(c: ReadonlyArray<number>, h: number): number[] {
  let deg = c.length - 1;
  const scale = c.reduce((m, v, p) => Math.max(m, Math.abs(v) * h ** p), 0);
  while (deg >= 0 && Math.abs(c[deg]) * h ** deg <= 1e-14 * scale) deg--;
  const inside = (ts: number[]) => ts.filter((t) => t > 0 && t < h).sort((a, b) => a - b);
  if (deg <= 0) return [];
  if (deg === 1) return inside([-c[0] / c[1]]);
  if (deg === 2) {
    const [c0, c1, c2] = c;
    const disc = c1 * c1 - 4 * c2 * c0;
    if (disc < 0) return [];
    // The stable form of the quadratic formula avoids cancellation.
    const q = -0.5 * (c1 + Math.sign(c1 || 1) * Math.sqrt(disc));
    return inside(q === 0 ? [0] : [q / c2, c0 / q]);
  }
  const poly = c.slice(0, deg + 1);
  const derivative = poly.slice(1).map((v, p) => (p + 1) * v);
  const ends = [0, ...rootsIn(derivative, h), h];
  const roots: number[] = [];
  for (let i = 0; i + 1 < ends.length; i++) {
    const fa = hornerArray(poly, ends[i]);
    const fb = hornerArray(poly, ends[i + 1]);
    if (fa === 0 && i > 0) roots.push(ends[i]);
    else if (fa * fb < 0) roots.push(bisect(poly, ends[i], ends[i + 1], fa));
  }
  return inside(roots);
}

/** Stationary points of a segment polynomial inside (0, h). */
function derivativeRoots(c: Float64Array, h: number): number[] {
  return rootsIn(
    Array.from({ length: NC - 1 }, (_, p) => (p + 1) * c[p + 1]),
    h,
  );
}

export interface Extreme {
  readonly value: number;
  /** Distance from the start node, m. */
  readonly x: number;
}

/** Max and min over [0, L]: segment ends (both sides of each break) and stationary points inside segments. */
export function extrema(pp: Piecewise): { max: Extreme; min: Extreme } {
  let max: Extreme = { value: -Infinity, x: 0 };
  let min: Extreme = { value: Infinity, x: 0 };
  const consider = (value: number, x: number) => {
    if (value > max.value) max = { value, x };
    if (value < min.value) min = { value, x };
  };
  pp.coeffs.forEach((c, k) => {
    const x0 = pp.breaks[k];
    const h = pp.breaks[k + 1] - x0;
    consider(horner(c, 0), x0);
    consider(horner(c, h), x0 + h);
    for (const t of derivativeRoots(c, h)) consider(horner(c, t), x0 + t);
  });
  return { max, min };
}
