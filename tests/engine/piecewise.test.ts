/** Piecewise polynomials behind the member diagrams: integration with steps, evaluation, exact extremes. */
import { describe, it, expect } from "vitest";
import { evaluate, extrema, fromGlobalPolynomial, integrate, zeroPiecewise } from "@/lib/engine/piecewise";
import { expectClose } from "./helpers";

describe("piecewise polynomials", () => {
  it("integrates with steps at the breaks and evaluates either side of them", () => {
    const breaks = Float64Array.of(0, 1, 3);
    const q = zeroPiecewise(breaks);
    q.coeffs.forEach((c) => (c[0] = -2)); // uniform −2
    const V = integrate(q, 5, Float64Array.of(0, -1)); // V(0) = 5, step −1 at x = 1
    expectClose(evaluate(V, 1, "left"), 3);
    expectClose(evaluate(V, 1, "right"), 2);
    expectClose(evaluate(V, 3), -2);
    const M = integrate(V, 0);
    // ∫₀³ V = [5x − x²]₀³ − 1·(3 − 1) = 6 − 2 = 4
    expectClose(evaluate(M, 3), 4);
  });

  it("finds every stationary point of a quintic exactly, matching a brute-force search", () => {
    // P'(x) = (x − 0.1)(x − 0.4)(x − 0.7)(x − 0.9); P(x) = ∫₀ˣ P'.
    const roots = [0.1, 0.4, 0.7, 0.9];
    let dp = [1];
    for (const r of roots) dp = [...dp.map((v) => -r * v), 0].map((v, i) => v + (i > 0 ? dp[i - 1] : 0));
    const p = [0, ...dp.map((v, i) => v / (i + 1))];
    const pp = fromGlobalPolynomial(p, Float64Array.of(0, 0.55, 1));
    const { max, min } = extrema(pp);
    let bruteMax = -Infinity;
    let bruteMin = Infinity;
    for (let i = 0; i <= 200_000; i++) {
      const v = evaluate(pp, i / 200_000);
      bruteMax = Math.max(bruteMax, v);
      bruteMin = Math.min(bruteMin, v);
    }
    expect(max.value).toBeGreaterThanOrEqual(bruteMax - 1e-15);
    expect(min.value).toBeLessThanOrEqual(bruteMin + 1e-15);
    for (const e of [max, min]) {
      const nearest = [0, ...roots, 1].reduce((a, b) => (Math.abs(b - e.x) < Math.abs(a - e.x) ? b : a));
      expect(Math.abs(nearest - e.x)).toBeLessThan(1e-9);
    }
  });
});
