/**
 * Parts of a section that rectangles and quarter-circle spandrels cannot draw (section-geometry.ts), for flanges
 * with a sloped inner face: a polygon, and a fillet between two faces that meet at any angle (a root fillet tangent
 * to a web and to a sloped flange). Every integral is a closed form, as in section-geometry.ts:
 * - a polygon's moments by the edge sums of Green's theorem;
 * - a fillet is the kite corner–tangent point–centre–tangent point less the circular sector inside it;
 * - the part of either below a line s = c: a polygon clipped by the half-plane; a sector clipped is the polygon of
 *   its chords, clipped, plus the circular segment of each piece of arc left inside (a sector is convex, and its
 *   arc is cut where the line crosses it, so each piece of arc lies wholly on one side).
 */

/** ∫dA, ∫x dA, ∫y dA, ∫x² dA, ∫y² dA, ∫xy dA over a region, about the section's origin. */
export interface RawMoments {
  a: number;
  qx: number;
  qy: number;
  xx: number;
  yy: number;
  xy: number;
}

/** A coordinate axis of the section's plane. */
export type Axis = "x" | "y";

export type Pt = readonly [number, number];

export type CurvedPart =
  | { kind: "poly"; sign: 1 | -1; points: readonly Pt[] }
  /** A fillet of radius r in the corner at `corner` between the faces leaving it along the unit vectors u and v. */
  | { kind: "fillet"; sign: 1 | -1; corner: Pt; u: Pt; v: Pt; r: number };

export const poly = (points: readonly Pt[], sign: 1 | -1 = 1): CurvedPart => ({ kind: "poly", sign, points });
export const fillet = (corner: Pt, u: Pt, v: Pt, r: number, sign: 1 | -1 = 1): CurvedPart => ({
  kind: "fillet",
  sign,
  corner,
  u,
  v,
  r,
});

const ZERO: RawMoments = { a: 0, qx: 0, qy: 0, xx: 0, yy: 0, xy: 0 };
const scaled = (m: RawMoments, k: number): RawMoments => ({
  a: k * m.a,
  qx: k * m.qx,
  qy: k * m.qy,
  xx: k * m.xx,
  yy: k * m.yy,
  xy: k * m.xy,
});
const minus = (m: RawMoments, n: RawMoments): RawMoments => ({
  a: m.a - n.a,
  qx: m.qx - n.qx,
  qy: m.qy - n.qy,
  xx: m.xx - n.xx,
  yy: m.yy - n.yy,
  xy: m.xy - n.xy,
});
const plus = (m: RawMoments, n: RawMoments): RawMoments => minus(m, scaled(n, -1));

/** A simple polygon's moments whichever way round its points go. */
function polygonMoments(points: readonly Pt[]): RawMoments {
  const m = { ...ZERO };
  for (let i = 0; i < points.length; i++) {
    const [x0, y0] = points[i];
    const [x1, y1] = points[(i + 1) % points.length];
    const cross = x0 * y1 - x1 * y0;
    m.a += cross / 2;
    m.qx += ((x0 + x1) * cross) / 6;
    m.qy += ((y0 + y1) * cross) / 6;
    m.xx += ((x0 * x0 + x0 * x1 + x1 * x1) * cross) / 12;
    m.yy += ((y0 * y0 + y0 * y1 + y1 * y1) * cross) / 12;
    m.xy += ((x0 * y1 + 2 * x0 * y0 + 2 * x1 * y1 + x1 * y0) * cross) / 24;
  }
  return m.a < 0 ? scaled(m, -1) : m;
}

/** The polygon's part where the coordinate along `axis` is below c (one half-plane of Sutherland–Hodgman). */
function clipPolygon(points: readonly Pt[], axis: Axis, c: number): Pt[] {
  const k = axis === "x" ? 0 : 1;
  const out: Pt[] = [];
  for (let i = 0; i < points.length; i++) {
    const p = points[i];
    const q = points[(i + 1) % points.length];
    const [pIn, qIn] = [p[k] < c, q[k] < c];
    if (pIn) out.push(p);
    if (pIn !== qIn) {
      const t = (c - p[k]) / (q[k] - p[k]);
      out.push([p[0] + t * (q[0] - p[0]), p[1] + t * (q[1] - p[1])]);
    }
  }
  return out;
}

/** The sector of radius r about o from angle t0 anticlockwise to t1 (t1 − t0 in (0, π]). */
function sectorMoments(o: Pt, r: number, t0: number, t1: number): RawMoments {
  const span = t1 - t0;
  const a = (r * r * span) / 2;
  const X = (r ** 3 / 3) * (Math.sin(t1) - Math.sin(t0));
  const Y = (r ** 3 / 3) * (Math.cos(t0) - Math.cos(t1));
  const s2 = (Math.sin(2 * t1) - Math.sin(2 * t0)) / 2;
  const XX = (r ** 4 / 8) * (span + s2);
  const YY = (r ** 4 / 8) * (span - s2);
  const XY = (r ** 4 / 16) * (Math.cos(2 * t0) - Math.cos(2 * t1));
  const [ox, oy] = o;
  return {
    a,
    qx: ox * a + X,
    qy: oy * a + Y,
    xx: ox * ox * a + 2 * ox * X + XX,
    yy: oy * oy * a + 2 * oy * Y + YY,
    xy: ox * oy * a + ox * Y + oy * X + XY,
  };
}

const at = (o: Pt, r: number, t: number): Pt => [o[0] + r * Math.cos(t), o[1] + r * Math.sin(t)];

/** A sector's part below s = c along `axis`. */
function sectorBelow(o: Pt, r: number, t0: number, t1: number, axis: Axis, c: number): RawMoments {
  const k = axis === "x" ? 0 : 1;
  // Where the line crosses the circle: o_k + r·cos(t) = c along x, o_k + r·sin(t) = c along y.
  const w = (c - o[k]) / r;
  const cuts: number[] = [];
  if (Math.abs(w) < 1) {
    const base = axis === "x" ? Math.acos(w) : Math.asin(w);
    const roots = axis === "x" ? [base, -base] : [base, Math.PI - base];
    for (const root of roots)
      for (const turn of [-2, -1, 0, 1, 2]) {
        const t = root + turn * 2 * Math.PI;
        if (t > t0 && t < t1) cuts.push(t);
      }
  }
  const angles = [t0, ...cuts.sort((p, q) => p - q), t1];
  const chords = clipPolygon([o, ...angles.map((t) => at(o, r, t))], axis, c);
  let m = chords.length >= 3 ? polygonMoments(chords) : { ...ZERO };
  for (let i = 0; i + 1 < angles.length; i++) {
    const [p, q] = [angles[i], angles[i + 1]];
    if (at(o, r, (p + q) / 2)[k] >= c) continue;
    m = plus(m, minus(sectorMoments(o, r, p, q), polygonMoments([o, at(o, r, p), at(o, r, q)])));
  }
  return m;
}

/** A fillet's kite (corner, tangent point, centre, tangent point) and the sector of its arc. */
function filletPieces({ corner, u, v, r }: Extract<CurvedPart, { kind: "fillet" }>) {
  const phi = Math.acos(Math.min(1, Math.max(-1, u[0] * v[0] + u[1] * v[1])));
  const tangent = r / Math.tan(phi / 2);
  const [bx, by] = [u[0] + v[0], u[1] + v[1]];
  const toCentre = r / Math.sin(phi / 2) / Math.hypot(bx, by);
  const t1: Pt = [corner[0] + tangent * u[0], corner[1] + tangent * u[1]];
  const t2: Pt = [corner[0] + tangent * v[0], corner[1] + tangent * v[1]];
  const o: Pt = [corner[0] + toCentre * bx, corner[1] + toCentre * by];
  const a1 = Math.atan2(t1[1] - o[1], t1[0] - o[0]);
  const a2 = Math.atan2(t2[1] - o[1], t2[0] - o[0]);
  let turn = a2 - a1;
  while (turn <= -Math.PI) turn += 2 * Math.PI;
  while (turn > Math.PI) turn -= 2 * Math.PI;
  const [from, to] = turn > 0 ? [a1, a1 + turn] : [a2, a2 - turn];
  return { kite: [corner, t1, o, t2] as Pt[], o, from, to, tangent, t1, t2 };
}

/** The tangent points and centre of a fillet, for a drawing. */
export function filletPoints(part: Extract<CurvedPart, { kind: "fillet" }>) {
  const { t1, t2, o, tangent } = filletPieces(part);
  return { t1, t2, centre: o, tangent };
}

export function curvedMoments(part: CurvedPart): RawMoments {
  if (part.kind === "poly") return scaled(polygonMoments(part.points), part.sign);
  const { kite, o, from, to } = filletPieces(part);
  return scaled(minus(polygonMoments(kite), sectorMoments(o, part.r, from, to)), part.sign);
}

/** Area and first moment (∫s dA) of the part of a curved part where s < c. */
export function curvedBelow(part: CurvedPart, axis: Axis, c: number): { a: number; q: number } {
  let m: RawMoments;
  if (part.kind === "poly") {
    const clipped = clipPolygon(part.points, axis, c);
    m = clipped.length >= 3 ? polygonMoments(clipped) : ZERO;
  } else {
    const { kite, o, from, to } = filletPieces(part);
    const clipped = clipPolygon(kite, axis, c);
    const kiteBelow = clipped.length >= 3 ? polygonMoments(clipped) : ZERO;
    m = minus(kiteBelow, sectorBelow(o, part.r, from, to, axis, c));
  }
  return { a: part.sign * m.a, q: part.sign * (axis === "x" ? m.qx : m.qy) };
}
