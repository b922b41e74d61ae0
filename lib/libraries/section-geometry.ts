/**
 * Exact area integrals of sections made of rectangles and fillets, for the section builder (sections.ts).
 *
 * A section is a signed sum of parts: rectangles, and "spandrels" — the region between a square corner and
 * a quarter circle tangent to both sides (the root fillet of a rolled section, or what a rounded corner
 * takes off a sharp one). A hole is a part with sign −1. Every integral here is a closed form (no sampling),
 * so the properties are exact up to floating point.
 *
 * Coordinates are chosen by the builders so that the origin sits near the centroid, which keeps the shift
 * of second moments to the centroid free of cancellation.
 */

import { curvedBelow, curvedMoments, type Axis, type CurvedPart, type RawMoments } from "./section-curves";

// Declared with the curved parts, which this module builds on, and read from here by the builders.
export type { Axis, RawMoments };

export type Part =
  | { kind: "rect"; sign: 1 | -1; x0: number; x1: number; y0: number; y1: number }
  /** A polygon, or a fillet between faces at any angle (section-curves.ts): tapered flanges. */
  | CurvedPart
  /** A spandrel of radius r whose square corner is at (cx, cy) and whose square lies towards (cx + sx·r, cy + sy·r). */
  | { kind: "spandrel"; sign: 1 | -1; cx: number; cy: number; sx: 1 | -1; sy: 1 | -1; r: number };

export const rect = (x0: number, x1: number, y0: number, y1: number, sign: 1 | -1 = 1): Part => ({
  kind: "rect",
  sign,
  x0,
  x1,
  y0,
  y1,
});
export const spandrel = (cx: number, cy: number, sx: 1 | -1, sy: 1 | -1, r: number, sign: 1 | -1 = 1): Part => ({
  kind: "spandrel",
  sign,
  cx,
  cy,
  sx,
  sy,
  r,
});

// A spandrel in its own frame: corner at (0, 0), square [0, r]², material where (u − r)² + (v − r)² ≥ r².
// Its integrals about the corner (square minus the quarter disc centred at (r, r)):
//   ∫dA = r²(1 − π/4), ∫u dA = r³(5/6 − π/4), ∫u² dA = r⁴(1 − 5π/16), ∫uv dA = r⁴(19/24 − π/4);
// symmetric in u and v. The height of material at u is h(u) = r − √(r² − (r − u)²).
function spandrelLocal(r: number) {
  return {
    a: r * r * (1 - Math.PI / 4),
    q: r ** 3 * (5 / 6 - Math.PI / 4),
    uu: r ** 4 * (1 - (5 * Math.PI) / 16),
    uv: r ** 4 * (19 / 24 - Math.PI / 4),
  };
}

/** Area and first moment (∫u dA) of the part of a spandrel with u < p, 0 ≤ p ≤ r. */
function spandrelBelowLocal(r: number, p: number): { a: number; q: number } {
  if (p <= 0) return { a: 0, q: 0 };
  if (p >= r) {
    const s = spandrelLocal(r);
    return { a: s.a, q: s.q };
  }
  // ∫₀ᵖ √(r² − (r − u)²) du = F(r) − F(r − p) with F(w) = (w√(r² − w²) + r² asin(w/r)) / 2.
  const w = r - p;
  const root = Math.sqrt(Math.max(r * r - w * w, 0));
  const disc = (Math.PI * r * r) / 4 - (w * root + r * r * Math.asin(Math.min(w / r, 1))) / 2;
  return { a: r * p - disc, q: (r * p * p) / 2 - r * disc + root ** 3 / 3 };
}

export function momentsOf(part: Part): RawMoments {
  if (part.kind === "poly" || part.kind === "fillet") return curvedMoments(part);
  if (part.kind === "rect") {
    const { x0, x1, y0, y1, sign } = part;
    const w = x1 - x0;
    const h = y1 - y0;
    return {
      a: sign * w * h,
      qx: (sign * h * (x1 * x1 - x0 * x0)) / 2,
      qy: (sign * w * (y1 * y1 - y0 * y0)) / 2,
      xx: (sign * h * (x1 ** 3 - x0 ** 3)) / 3,
      yy: (sign * w * (y1 ** 3 - y0 ** 3)) / 3,
      xy: (sign * (x1 * x1 - x0 * x0) * (y1 * y1 - y0 * y0)) / 4,
    };
  }
  const { cx, cy, sx, sy, r, sign } = part;
  const s = spandrelLocal(r);
  // x = cx + sx·u, y = cy + sy·v.
  return {
    a: sign * s.a,
    qx: sign * (cx * s.a + sx * s.q),
    qy: sign * (cy * s.a + sy * s.q),
    xx: sign * (cx * cx * s.a + 2 * cx * sx * s.q + s.uu),
    yy: sign * (cy * cy * s.a + 2 * cy * sy * s.q + s.uu),
    xy: sign * (cx * cy * s.a + (cx * sy + cy * sx) * s.q + sx * sy * s.uv),
  };
}

export function sumMoments(parts: readonly Part[]): RawMoments {
  const total: RawMoments = { a: 0, qx: 0, qy: 0, xx: 0, yy: 0, xy: 0 };
  for (const part of parts) {
    const m = momentsOf(part);
    total.a += m.a;
    total.qx += m.qx;
    total.qy += m.qy;
    total.xx += m.xx;
    total.yy += m.yy;
    total.xy += m.xy;
  }
  return total;
}

/** Area, centroid and second moments about centroidal axes parallel to x and y (Ix = ∫(y − yc)² dA). */
export function centroidalOf(parts: readonly Part[]) {
  const m = sumMoments(parts);
  const xc = m.qx / m.a;
  const yc = m.qy / m.a;
  return { A: m.a, xc, yc, Ix: m.yy - m.a * yc * yc, Iy: m.xx - m.a * xc * xc, Ixy: m.xy - m.a * xc * yc };
}

/** Area and first moment (∫s dA, s the coordinate along `axis`) of the part of a region where s < c. */
export function below(part: Part, axis: Axis, c: number): { a: number; q: number } {
  if (part.kind === "poly" || part.kind === "fillet") return curvedBelow(part, axis, c);
  if (part.kind === "rect") {
    const [s0, s1, w] = axis === "x" ? [part.x0, part.x1, part.y1 - part.y0] : [part.y0, part.y1, part.x1 - part.x0];
    const top = Math.min(Math.max(c, s0), s1);
    return { a: part.sign * w * (top - s0), q: (part.sign * w * (top * top - s0 * s0)) / 2 };
  }
  const [corner, dir] = axis === "x" ? [part.cx, part.sx] : [part.cy, part.sy];
  const whole = spandrelLocal(part.r);
  // In the spandrel's frame s = corner + dir·u: s < c is u < c − corner (dir +1) or u > corner − c (dir −1).
  let local: { a: number; q: number };
  if (dir === 1) local = spandrelBelowLocal(part.r, c - corner);
  else {
    const lower = spandrelBelowLocal(part.r, corner - c);
    local = { a: whole.a - lower.a, q: whole.q - lower.q };
  }
  return { a: part.sign * local.a, q: part.sign * (corner * local.a + dir * local.q) };
}

function belowAll(parts: readonly Part[], axis: Axis, c: number) {
  let a = 0;
  let q = 0;
  for (const part of parts) {
    const p = below(part, axis, c);
    a += p.a;
    q += p.q;
  }
  return { a, q };
}

/**
 * The plastic neutral axis (s = c, parallel to the other axis) splits the area in two equal halves; the
 * plastic modulus is ∫|s − c| dA. `symmetricAt` gives c directly for an axis of symmetry; otherwise c is
 * found by bisection between the extremes `lo` and `hi` (the area below c is continuous and increasing).
 * Z is stationary in c at the equal-area point, so an error in c enters Z only to second order.
 */
export function plasticModulus(
  parts: readonly Part[],
  axis: Axis,
  extent: { lo: number; hi: number; symmetricAt?: number },
): { Z: number; c: number } {
  const total = sumMoments(parts);
  const q = axis === "x" ? total.qx : total.qy;
  let c = extent.symmetricAt;
  if (c === undefined) {
    let lo = extent.lo;
    let hi = extent.hi;
    for (let i = 0; i < 200 && hi - lo > 0; i++) {
      const mid = lo + (hi - lo) / 2;
      if (mid <= lo || mid >= hi) break;
      if (belowAll(parts, axis, mid).a < total.a / 2) lo = mid;
      else hi = mid;
    }
    c = lo + (hi - lo) / 2;
  }
  const b = belowAll(parts, axis, c);
  return { Z: q - b.q - c * (total.a - b.a) + (c * b.a - b.q), c };
}

/**
 * An angle's outline where it can be farthest from an axis, relative to the centroid: its convex corners and
 * the two toe arcs (centre and radius; each spans the quarter facing +x, +y). The root fillet lies inside
 * the hull of these, so it is never an extreme fibre.
 */
export function angleOutline(b: number, d: number, t: number, r2: number, xc: number, yc: number) {
  const at = (x: number, y: number): [number, number] => [x - xc, y - yc];
  return {
    points: [at(0, 0), at(b, 0), at(b, t - r2), at(b - r2, t), at(t, d - r2), at(t - r2, d), at(0, d)],
    arcs: [at(b - r2, t - r2), at(t - r2, d - r2)].map((centre) => ({ centre, radius: r2 })),
  };
}

/** The largest distance of the outline from the axis through the centroid whose normal is (nx, ny). */
export function farthestFrom(outline: ReturnType<typeof angleOutline>, nx: number, ny: number): number {
  let most = Math.max(...outline.points.map(([x, y]) => Math.abs(nx * x + ny * y)));
  for (const { centre, radius } of outline.arcs) {
    // Along ±n an arc reaches centre·n ± radius where ±n points into its quarter; otherwise an end (a point above) is farthest.
    for (const sign of [1, -1]) {
      if (sign * nx >= 0 && sign * ny >= 0) most = Math.max(most, Math.abs(nx * centre[0] + ny * centre[1] + sign * radius));
    }
  }
  return most;
}
