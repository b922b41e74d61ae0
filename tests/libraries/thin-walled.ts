/**
 * An independent check of the section builder's shear centre and warping constant: a thin-walled open section
 * as straight plates on their mid-lines (each a segment with a thickness), analysed from first principles —
 * sectorial coordinate ω about a trial pole, the shear centre as the pole about which ∫ωx dA = ∫ωy dA = 0 (x, y
 * centroidal), and Cw = ∫ω² dA with ω normalised to ∫ω dA = 0. Along a plate x, y and ω are linear, so every
 * integrand is at most quadratic and Simpson's rule is exact. No formula of the builder's is used.
 */

export interface Plate {
  /** Mid-line end points; plates must form a tree, each plate after the first starting at a point already reached. */
  from: [number, number];
  to: [number, number];
  t: number;
}

const same = (a: [number, number], b: [number, number]) => a[0] === b[0] && a[1] === b[1];

/** ∫ f dA over a plate with f linear-times-linear, by Simpson's rule (exact for quadratics). */
function simpson(length: number, t: number, f0: number, fm: number, f1: number) {
  return (length * t * (f0 + 4 * fm + f1)) / 6;
}

export function thinWalled(plates: Plate[]) {
  // Area and centroid.
  let A = 0;
  let Sx = 0;
  let Sy = 0;
  const lengths = plates.map((p) => Math.hypot(p.to[0] - p.from[0], p.to[1] - p.from[1]));
  plates.forEach((p, i) => {
    const a = lengths[i] * p.t;
    A += a;
    Sx += (a * (p.from[0] + p.to[0])) / 2;
    Sy += (a * (p.from[1] + p.to[1])) / 2;
  });
  const [xc, yc] = [Sx / A, Sy / A];
  // Sectorial coordinate about the centroid as trial pole, walked from the first plate's start.
  const omegaAt: { point: [number, number]; omega: number }[] = [{ point: plates[0].from, omega: 0 }];
  const ends: [number, number][] = [];
  for (const p of plates) {
    const start = omegaAt.find((o) => same(o.point, p.from));
    if (!start) throw new Error("plates must be listed so that each starts where an earlier one reached");
    const [x0, y0, x1, y1] = [p.from[0] - xc, p.from[1] - yc, p.to[0] - xc, p.to[1] - yc];
    const omega = start.omega + (x0 * y1 - x1 * y0);
    omegaAt.push({ point: p.to, omega });
    ends.push([start.omega, omega]);
  }
  // Second moments and sectorial products about the centroid.
  const integral = (f: (x: number, y: number, w: number) => number) =>
    plates.reduce((sum, p, i) => {
      const [w0, w1] = ends[i];
      const [x0, y0, x1, y1] = [p.from[0] - xc, p.from[1] - yc, p.to[0] - xc, p.to[1] - yc];
      return sum + simpson(lengths[i], p.t, f(x0, y0, w0), f((x0 + x1) / 2, (y0 + y1) / 2, (w0 + w1) / 2), f(x1, y1, w1));
    }, 0);
  const Ix = integral((_x, y) => y * y);
  const Iy = integral((x) => x * x);
  const Ixy = integral((x, y) => x * y);
  const Ixw = integral((_x, y, w) => y * w);
  const Iyw = integral((x, _y, w) => x * w);
  // Pole moved by (a, b): ω' = ω − a y + b x + const. Solve ∫ω'x = 0 and ∫ω'y = 0 for (a, b).
  //   Iyw − a Ixy + b Iy = 0;   Ixw − a Ix + b Ixy = 0.
  const det = -Ixy * Ixy + Ix * Iy;
  const a = (Iyw * Ixy - Ixw * Iy) / -det;
  const b = (-Iyw * Ix + Ixw * Ixy) / det;
  const shifted = (x: number, y: number, w: number) => w - a * y + b * x;
  const mean = integral(shifted) / A;
  const Cw = integral((x, y, w) => (shifted(x, y, w) - mean) ** 2);
  return { A, xc, yc, Ix, Iy, xs: xc + a, ys: yc + b, Cw };
}
