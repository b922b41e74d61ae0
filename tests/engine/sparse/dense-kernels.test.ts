import { describe, expect, it } from "vitest";
import { subtractOuterProducts } from "@/lib/engine/sparse/dense-kernels";
import { createRandom } from "./dense-reference";

// The unrolled kernel against the plain triple loop of its own definition, F[i, j] −= Σ_t F[i, t] · F[j, t] for
// the lower part (i ≥ j) of the target columns J, with the columns T read before anything is written (T and J
// never overlap in use). Every other entry of the array, before, inside and after the block, must be untouched.

interface Case {
  ld: number;
  jFrom: number;
  jTo: number;
  tFrom: number;
  tTo: number;
  base: number;
}

/** The update by its definition, from the values before the call (common practice: a rank-k update of a lower triangle). */
function expectedUpdate(
  before: Float64Array,
  { ld, jFrom, jTo, tFrom, tTo, base }: Case,
): { value: Float64Array; scale: Float64Array } {
  const value = before.slice();
  const scale = Float64Array.from(before, Math.abs);
  for (let j = jFrom; j < jTo; j++)
    for (let i = j; i < ld; i++)
      for (let t = tFrom; t < tTo; t++) {
        const product = before[base + t * ld + i] * before[base + t * ld + j];
        value[base + j * ld + i] -= product;
        scale[base + j * ld + i] += Math.abs(product);
      }
  return { value, scale };
}

function check(random: () => number, c: Case): void {
  const f = Float64Array.from({ length: c.base + c.ld * c.ld + 9 }, () => random() * 2 - 1);
  const before = f.slice();
  subtractOuterProducts(f, c.ld, c.jFrom, c.jTo, c.tFrom, c.tTo, c.base);
  const { value, scale } = expectedUpdate(before, c);
  for (let q = 0; q < f.length; q++) {
    // Sums of at most a dozen products, added in another order: a few ulps of the sum of their sizes.
    const error = Math.abs(f[q] - value[q]);
    if (!(error <= 1e-14 * scale[q]))
      throw new Error(`entry ${q} of ${JSON.stringify(c)}: ${f[q]} against ${value[q]} (was ${before[q]})`);
  }
}

describe("subtractOuterProducts", () => {
  it("updates the lower part of the target columns as the triple loop does, and nothing else (every split up to 11 × 11)", () => {
    const random = createRandom(2026);
    for (let ld = 1; ld <= 11; ld++)
      for (let jFrom = 0; jFrom <= ld; jFrom++)
        for (let jTo = jFrom; jTo <= ld; jTo++) {
          const base = (ld + jFrom + jTo) % 3 === 0 ? 0 : 5;
          // Every column before the targets, the last few before them, and the columns after them.
          check(random, { ld, jFrom, jTo, tFrom: 0, tTo: jFrom, base });
          check(random, { ld, jFrom, jTo, tFrom: Math.max(0, jFrom - 5), tTo: jFrom, base });
          if (jFrom > 1) check(random, { ld, jFrom, jTo, tFrom: 1, tTo: jFrom - 1, base });
          check(random, { ld, jFrom, jTo, tFrom: jTo, tTo: ld, base });
        }
  });

  it("leaves the block as it was when there is no source column, or the source range is reversed", () => {
    const random = createRandom(7);
    for (const [tFrom, tTo] of [
      [3, 3],
      [4, 1],
    ]) {
      const f = Float64Array.from({ length: 64 }, () => random());
      const before = f.slice();
      subtractOuterProducts(f, 8, 0, 8, tFrom, tTo);
      expect(f).toEqual(before);
    }
  });

  it("gives the Cholesky factor of a 9 × 9 matrix when used column by column as the factorisation does", () => {
    // A = M Mᵀ with M lower triangular and a positive diagonal, so its Cholesky factor is M itself (the factor is
    // unique; common practice). Left-looking: column k gets the products of the columns before it, then is
    // scaled by the square root of its pivot.
    const n = 9;
    const random = createRandom(99);
    const m = Array.from({ length: n }, (_, i) =>
      Array.from({ length: n }, (_, j) => (j > i ? 0 : j === i ? 1 + random() : random() - 0.5)),
    );
    const f = new Float64Array(n * n);
    for (let j = 0; j < n; j++) for (let i = j; i < n; i++) for (let t = 0; t <= j; t++) f[j * n + i] += m[i][t] * m[j][t];
    for (let k = 0; k < n; k++) {
      subtractOuterProducts(f, n, k, k + 1, 0, k);
      const d = Math.sqrt(f[k * n + k]);
      for (let i = k; i < n; i++) f[k * n + i] /= d;
    }
    for (let j = 0; j < n; j++)
      for (let i = j; i < n; i++) expect(Math.abs(f[j * n + i] - m[i][j])).toBeLessThan(1e-13 * Math.max(1, Math.abs(m[i][j])));
  });
});
