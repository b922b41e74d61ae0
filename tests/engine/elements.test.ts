/** Element matrices against hand-derived ones, entries written out. */
import { describe, it, expect } from "vitest";
import { condense, frameLocalStiffness, toGlobalStiffness, THETA_J } from "@/lib/engine/elements";
import { fixedEndForces } from "@/lib/engine/loads";
import { expectClose } from "./helpers";

// E = 1000, A = 8, I = 16, L = 4: EA/L = 2000, 12EI/L³ = 3000, 6EI/L² = 6000, 4EI/L = 16000, 2EI/L = 8000.
const LOCAL = [
  [2000, 0, 0, -2000, 0, 0],
  [0, 3000, 6000, 0, -3000, 6000],
  [0, 6000, 16000, 0, -6000, 8000],
  [-2000, 0, 0, 2000, 0, 0],
  [0, -3000, -6000, 0, 3000, -6000],
  [0, 6000, 8000, 0, -6000, 16000],
];

function expectMatrix(actual: Float64Array, expected: number[][]) {
  const scale = Math.max(...expected.flat().map(Math.abs));
  expected.forEach((row, i) => row.forEach((v, j) => expectClose(actual[i * 6 + j], v, 1e-12, scale)));
}

describe("frame element", () => {
  it("local stiffness is the bar overlaid with the Euler–Bernoulli beam", () => {
    expectMatrix(frameLocalStiffness(1000, 8, 16, 4), LOCAL);
  });

  it("horizontal member: global equals local", () => {
    expectMatrix(toGlobalStiffness(frameLocalStiffness(1000, 8, 16, 4), 1, 0), LOCAL);
  });

  it("vertical member (c = 0, s = 1): X = −v, Y = u", () => {
    // Hand transformation: K_XX = k_vv, K_YY = k_uu, K_Xθ = −k_vθ, K_Yθ = k_uθ = 0.
    expectMatrix(toGlobalStiffness(frameLocalStiffness(1000, 8, 16, 4), 0, 1), [
      [3000, 0, -6000, -3000, 0, -6000],
      [0, 2000, 0, 0, -2000, 0],
      [-6000, 0, 16000, 6000, 0, 8000],
      [-3000, 0, 6000, 3000, 0, 6000],
      [0, -2000, 0, 0, 2000, 0],
      [-6000, 0, 8000, 6000, 0, 16000],
    ]);
  });

  it("inclined member at 30°: K = Tᵀ k T entry by entry, symmetric", () => {
    const c = Math.cos(Math.PI / 6);
    const s = Math.sin(Math.PI / 6);
    const K = toGlobalStiffness(frameLocalStiffness(1000, 8, 16, 4), c, s);
    // K_X1X1 = c²·EA/L + s²·12EI/L³; K_X1Y1 = cs(EA/L − 12EI/L³); K_X1θ1 = −s·6EI/L²; K_Y1θ1 = c·6EI/L²
    expectClose(K[0], c * c * 2000 + s * s * 3000);
    expectClose(K[1], c * s * (2000 - 3000));
    expectClose(K[2], -s * 6000);
    expectClose(K[6 + 2], c * 6000);
    for (let i = 0; i < 6; i++) for (let j = 0; j < 6; j++) expectClose(K[i * 6 + j], K[j * 6 + i], 1e-12, 16000);
  });

  it("moment release at the end condenses to the propped-cantilever stiffness", () => {
    // Released θ_j: on (v_i, θ_i, v_j) the beam part is 3EI/L³·[1, L, −1; L, L², −L; −1, −L, 1]:
    // 3EI/L³ = 750, 3EI/L² = 3000, 3EI/L = 12000. The axial part is unchanged.
    const { k } = condense(frameLocalStiffness(1000, 8, 16, 4), null, [THETA_J]);
    expectMatrix(k, [
      [2000, 0, 0, -2000, 0, 0],
      [0, 750, 3000, 0, -750, 0],
      [0, 3000, 12000, 0, -3000, 0],
      [-2000, 0, 0, 2000, 0, 0],
      [0, -750, -3000, 0, 750, 0],
      [0, 0, 0, 0, 0, 0],
    ]);
  });

  it("fixed-end forces of a uniform load, and condensed for a released end", () => {
    const L = 4;
    const w = -10; // downward along local y
    const fef = fixedEndForces({ distributed: [{ axis: 1, a: 0, b: L, wa: w, wb: w }], concentrated: [] }, L);
    // Clamped–clamped: reactions wL/2 up, moments wL²/12 (counter-clockwise at i, clockwise at j).
    [0, 20, 40 / 3, 0, 20, -40 / 3].forEach((v, i) => expectClose(fef[i], v, 1e-12, 20));
    // Released at j (propped cantilever): 5wL/8 and wL²/8 at the fixed end, 3wL/8 at the pin.
    const released = condense(frameLocalStiffness(1000, 8, 16, L), fef, [THETA_J]).fef!;
    [0, 25, 20, 0, 15, 0].forEach((v, i) => expectClose(released[i], v, 1e-12, 20));
    expect(released.length).toBe(6);
  });
});
