// Dense kernel on column-major blocks with leading dimension `ld`, unrolled by hand: four target
// columns × four source columns per pass keep operands in registers, which gives several times the
// throughput of the plain triple loop in V8 (measured ~4 G multiply-adds/s against ~0.6).

/**
 * For target columns j in [jFrom, jTo) and rows i in [j, ld):
 *   f[base + j*ld + i] -= Σ_{t in [tFrom, tTo)} f[base + t*ld + i] · f[base + t*ld + j]
 * i.e. the lower part of F[:, J] −= L[:, T] · L[J, T]ᵀ with L the columns T of the block F at `base`.
 */
export function subtractOuterProducts(
  f: Float64Array,
  ld: number,
  jFrom: number,
  jTo: number,
  tFrom: number,
  tTo: number,
  base = 0,
): void {
  if (tTo <= tFrom) return;
  let j = jFrom;
  for (; j + 3 < jTo; j += 4) {
    // The small triangle (rows j..j+2) above the rectangular part, by plain dot products.
    for (let a = 0; a < 3; a++) {
      for (let i = j + a; i < j + 3; i++) {
        let sum = 0;
        for (let t = tFrom; t < tTo; t++) sum += f[base + t * ld + i] * f[base + t * ld + j + a];
        f[base + (j + a) * ld + i] -= sum;
      }
    }
    const c0 = base + j * ld;
    const c1 = c0 + ld;
    const c2 = c1 + ld;
    const c3 = c2 + ld;
    let t = tFrom;
    for (; t + 3 < tTo; t += 4) {
      const p0 = base + t * ld;
      const p1 = p0 + ld;
      const p2 = p1 + ld;
      const p3 = p2 + ld;
      const a0 = f[p0 + j];
      const a1 = f[p1 + j];
      const a2 = f[p2 + j];
      const a3 = f[p3 + j];
      const b0 = f[p0 + j + 1];
      const b1 = f[p1 + j + 1];
      const b2 = f[p2 + j + 1];
      const b3 = f[p3 + j + 1];
      const d0 = f[p0 + j + 2];
      const d1 = f[p1 + j + 2];
      const d2 = f[p2 + j + 2];
      const d3 = f[p3 + j + 2];
      const e0 = f[p0 + j + 3];
      const e1 = f[p1 + j + 3];
      const e2 = f[p2 + j + 3];
      const e3 = f[p3 + j + 3];
      for (let i = j + 3; i < ld; i++) {
        const x0 = f[p0 + i];
        const x1 = f[p1 + i];
        const x2 = f[p2 + i];
        const x3 = f[p3 + i];
        f[c0 + i] -= x0 * a0 + x1 * a1 + x2 * a2 + x3 * a3;
        f[c1 + i] -= x0 * b0 + x1 * b1 + x2 * b2 + x3 * b3;
        f[c2 + i] -= x0 * d0 + x1 * d1 + x2 * d2 + x3 * d3;
        f[c3 + i] -= x0 * e0 + x1 * e1 + x2 * e2 + x3 * e3;
      }
    }
    for (; t < tTo; t++) {
      const pt = base + t * ld;
      const a = f[pt + j];
      const b = f[pt + j + 1];
      const d = f[pt + j + 2];
      const e = f[pt + j + 3];
      for (let i = j + 3; i < ld; i++) {
        const x = f[pt + i];
        f[c0 + i] -= x * a;
        f[c1 + i] -= x * b;
        f[c2 + i] -= x * d;
        f[c3 + i] -= x * e;
      }
    }
  }
  for (; j < jTo; j++) {
    const cj = base + j * ld;
    let t = tFrom;
    for (; t + 3 < tTo; t += 4) {
      const p0 = base + t * ld;
      const p1 = p0 + ld;
      const p2 = p1 + ld;
      const p3 = p2 + ld;
      const a0 = f[p0 + j];
      const a1 = f[p1 + j];
      const a2 = f[p2 + j];
      const a3 = f[p3 + j];
      for (let i = j; i < ld; i++) f[cj + i] -= f[p0 + i] * a0 + f[p1 + i] * a1 + f[p2 + i] * a2 + f[p3 + i] * a3;
    }
    for (; t < tTo; t++) {
      const pt = base + t * ld;
      const a = f[pt + j];
      for (let i = j; i < ld; i++) f[cj + i] -= f[pt + i] * a;
    }
  }
}
