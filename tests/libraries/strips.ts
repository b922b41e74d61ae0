/**
 * An independent check of the section builder: a section cut into thin strips across one axis, each strip's
 * width read off the outline (chord lengths written here from the drawing, not from the builder's parts),
 * and the strips summed by tanh–sinh quadrature between the outline's breakpoints. Tanh–sinh crowds its
 * strips towards each end of a segment, so the square-root behaviour of a fillet's width where its arc
 * meets a flat face costs no accuracy: the sums agree with exact integrals to about 1e-13.
 */

/** Width of material at coordinate s, and where the outline has a corner (the width a kink or a jump). */
export interface StripShape {
  width: (s: number) => number;
  breaks: number[];
}

/** Nodes and weights of tanh–sinh on [−1, 1], step 1/64 up to |t| = 4. */
const NODES: { x: number; w: number }[] = (() => {
  const out: { x: number; w: number }[] = [];
  const h = 1 / 64;
  for (let k = -256; k <= 256; k++) {
    const t = k * h;
    const u = (Math.PI / 2) * Math.sinh(t);
    const x = Math.tanh(u);
    const w = (h * (Math.PI / 2) * Math.cosh(t)) / Math.cosh(u) ** 2;
    if (Math.abs(x) < 1 && w > 0) out.push({ x, w });
  }
  return out;
})();

function integrate(f: (s: number) => number, breaks: number[], from: number, to: number): number {
  const points = [...new Set([from, ...breaks.filter((b) => b > from && b < to), to])].sort((a, b) => a - b);
  let sum = 0;
  for (let i = 0; i + 1 < points.length; i++) {
    const [a, b] = [points[i], points[i + 1]];
    const half = (b - a) / 2;
    const mid = (a + b) / 2;
    for (const { x, w } of NODES) sum += half * w * f(mid + half * x);
  }
  return sum;
}

/** Area, centroid, second moment about the centroid, plastic neutral axis (equal areas) and plastic modulus. */
export function stripProperties(shape: StripShape) {
  const lo = Math.min(...shape.breaks);
  const hi = Math.max(...shape.breaks);
  const { width, breaks } = shape;
  const A = integrate(width, breaks, lo, hi);
  const sc = integrate((s) => s * width(s), breaks, lo, hi) / A;
  const I = integrate((s) => (s - sc) ** 2 * width(s), breaks, lo, hi);
  // The equal-area axis by bisection on the area below it.
  let [a, b] = [lo, hi];
  for (let i = 0; i < 100; i++) {
    const mid = (a + b) / 2;
    if (integrate(width, breaks, lo, mid) < A / 2) a = mid;
    else b = mid;
  }
  const c = (a + b) / 2;
  const Z = integrate((s) => Math.abs(s - c) * width(s), [...breaks, c], lo, hi);
  return { A, sc, I, c, Z };
}

/** ∫ s · (∫ x dx over the strip) ds for strips that run from x = 0 to x = width(s): the raw product ∫xy dA. */
export function stripProduct(shape: StripShape): number {
  const lo = Math.min(...shape.breaks);
  const hi = Math.max(...shape.breaks);
  return integrate((s) => (s * shape.width(s) ** 2) / 2, shape.breaks, lo, hi);
}

/**
 * r − √(r² − u²): how far a quarter circle of radius r stands off the tangent line it leaves at u = 0, at
 * distance u along it (0 at u = 0, r at u = r). It is both the width a root fillet adds beside a web, u
 * measured from where the fillet starts, and the width a rounded corner takes off, u measured into the corner.
 */
export function arcOffset(r: number, u: number): number {
  if (u <= 0) return 0;
  if (u >= r) return r;
  return r - Math.sqrt(r * r - u * u);
}
