/**
 * An independent check of the torsion constants with fillets: Saint-Venant's problem solved on a grid. Prandtl's
 * stress function φ solves ∇²φ = −2 in the section with φ = 0 on its outline, and J = 2∫φ dA (Timoshenko &
 * Goodier, Theory of Elasticity, 3rd ed., §101, from memory). Five-point differences on square cells whose faces lie
 * on the section's straight faces (a cell outside mirrors its neighbour, so φ = 0 falls on the face: second order
 * there); a cell belongs to the section when its centre does, so a fillet's arc is drawn in steps. Solved by
 * conjugate gradients, on two grids, and extrapolated as for an error in h²: a solid rectangle comes out to its
 * series value (sections.test.ts) within 1e-5; a fillet's steps leave a few tenths of a per cent.
 */

/** Whether the point (x, y) lies in the section. */
export type Inside = (x: number, y: number) => boolean;

/** J on one grid of cell size h over the box [x0, x1] × [y0, y1], whose sides must be whole numbers of cells. */
export function prandtlJ(inside: Inside, box: [number, number, number, number], h: number): number {
  const [x0, x1, y0, y1] = box;
  const nx = Math.round((x1 - x0) / h);
  const ny = Math.round((y1 - y0) / h);
  const index = new Int32Array(nx * ny).fill(-1);
  let n = 0;
  for (let j = 0; j < ny; j++)
    for (let i = 0; i < nx; i++) if (inside(x0 + (i + 0.5) * h, y0 + (j + 0.5) * h)) index[j * nx + i] = n++;
  const neighbours = new Int32Array(4 * n).fill(-1);
  const diagonal = new Float64Array(n);
  for (let j = 0; j < ny; j++)
    for (let i = 0; i < nx; i++) {
      const k = index[j * nx + i];
      if (k < 0) continue;
      [
        [i - 1, j],
        [i + 1, j],
        [i, j - 1],
        [i, j + 1],
      ].forEach(([a, b], m) => {
        const other = a >= 0 && a < nx && b >= 0 && b < ny ? index[b * nx + a] : -1;
        neighbours[4 * k + m] = other;
        diagonal[k] += other >= 0 ? 1 : 2;
      });
    }
  // K φ = 2h² with K symmetric positive definite; conjugate gradients with the diagonal as preconditioner.
  const phi = new Float64Array(n);
  const r = new Float64Array(n).fill(2 * h * h);
  const z = r.map((v, k) => v / diagonal[k]);
  const p = Float64Array.from(z);
  const Kp = new Float64Array(n);
  let rz = r.reduce((s, v, k) => s + v * z[k], 0);
  const start = Math.sqrt(rz);
  for (let step = 0; step < 50_000 && Math.sqrt(rz) > 1e-12 * start; step++) {
    let pKp = 0;
    for (let k = 0; k < n; k++) {
      let s = diagonal[k] * p[k];
      for (let m = 0; m < 4; m++) {
        const other = neighbours[4 * k + m];
        if (other >= 0) s -= p[other];
      }
      Kp[k] = s;
      pKp += p[k] * s;
    }
    const alpha = rz / pKp;
    let next = 0;
    for (let k = 0; k < n; k++) {
      phi[k] += alpha * p[k];
      r[k] -= alpha * Kp[k];
      z[k] = r[k] / diagonal[k];
      next += r[k] * z[k];
    }
    const beta = next / rz;
    rz = next;
    for (let k = 0; k < n; k++) p[k] = z[k] + beta * p[k];
  }
  return 2 * phi.reduce((s, v) => s + v, 0) * h * h;
}

/** J on grids of h and h/2, extrapolated as for an error in h². */
export function prandtlJExtrapolated(inside: Inside, box: [number, number, number, number], h: number): number {
  const [coarse, fine] = [prandtlJ(inside, box, h), prandtlJ(inside, box, h / 2)];
  return (4 * fine - coarse) / 3;
}

/** An angle: the heel at the origin, leg b along x and leg d along y, thickness t, root fillet r, square toes. */
export const angleInside =
  (b: number, d: number, t: number, r: number): Inside =>
  (x, y) => {
    if (x < 0 || y < 0 || x > b || y > d) return false;
    if (x <= t || y <= t) return true;
    return x < t + r && y < t + r && Math.hypot(x - t - r, y - t - r) >= r;
  };

/** A channel: the back of the web at x = 0, mid-depth at y = 0, flanges towards +x. */
export const channelInside =
  (b: number, d: number, tf: number, tw: number, r: number): Inside =>
  (x, y) => {
    const [u, yi] = [Math.abs(y), d / 2 - tf];
    if (x < 0 || x > b || u > d / 2) return false;
    if (x <= tw || u >= yi) return true;
    return x < tw + r && u > yi - r && Math.hypot(x - tw - r, u - (yi - r)) >= r;
  };

/** An I section, centred: two channels back to back, each web half as thick. */
export const iInside =
  (b: number, d: number, tf: number, tw: number, r: number): Inside =>
  (x, y) =>
    channelInside(b / 2 + tw / 2, d, tf, tw, r)(Math.abs(x) + tw / 2, y);
