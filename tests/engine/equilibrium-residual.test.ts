/**
 * The equilibrium check every result carries (ΣF and ΣM about the origin of applied loads plus reactions,
 * and its size relative to the loads), on force systems summed by hand. Statics (common practice).
 */
import { describe, expect, it } from "vitest";
import { equilibriumResidual } from "@/lib/engine/results";
import type { Model } from "@/lib/engine/model";
import { analyzeOrThrow, expectClose, lineBeam } from "./helpers";

const twoNodes = {
  nodes: [
    { x: 0, y: 0 },
    { x: 2, y: 1 },
  ],
} as unknown as Model;

describe("equilibriumResidual", () => {
  it("sums an unbalanced system: forces, moments about the origin, and the larger relative part", () => {
    // Applied at (2, 1): X = 3, Y = 4, M = 5. Reactions at (0, 0): X = −3, Y = −1, M = 2.
    const applied = [0, 0, 0, 3, 4, 5];
    const reactions = [-3, -1, 2, 0, 0, 0];
    const r = equilibriumResidual(twoNodes, applied, reactions);
    expect(r.fx).toBe(0);
    expect(r.fy).toBe(3);
    // 2·4 − 1·3 + 5 = 10 from the load, + 2 from the reaction couple.
    expect(r.mz).toBe(12);
    // Force part 3 / (3 + 4 + 3 + 1) = 0.2727…; moment part 12 / (8 + 3 + 5 + 2) = 0.6667: the larger counts.
    expectClose(r.relative, 12 / 18, 1e-15);
  });

  it("takes the force part when it is the larger", () => {
    const r = equilibriumResidual(twoNodes, [0, 0, 0, 0, 0, 0], [0, 0, 0, 0, 2, -4]);
    // fy = 2 with scale 2: 1. Moment 2·2 − 4 = 0.
    expect(r).toEqual({ fx: 0, fy: 2, mz: 0, relative: 1 });
  });

  it("is zero for a balanced system and for no loads at all", () => {
    // 10 down at (2, 1), held by 5 up at each node and a couple of 10 at (0, 0):
    // ΣM about the origin = 2·(−10) + 2·5 + 10 = 0.
    const r = equilibriumResidual(twoNodes, [0, 0, 0, 0, -10, 0], [0, 5, 10, 0, 5, 0]);
    expect(r).toEqual({ fx: 0, fy: 0, mz: 0, relative: 0 });
    expect(equilibriumResidual(twoNodes, [0, 0, 0, 0, 0, 0], [0, 0, 0, 0, 0, 0])).toEqual({ fx: 0, fy: 0, mz: 0, relative: 0 });
  });

  it("keeps the sign of an unbalanced horizontal force", () => {
    // 5 applied to the right at (2, 1), 2 of reaction to the left at (0, 0): 3 to the right is left over.
    // ΣM about the origin = −1·5 = −5. Force part 3 / 7; moment part 5 / 5 = 1.
    expect(equilibriumResidual(twoNodes, [0, 0, 0, 5, 0, 0], [-2, 0, 0, 0, 0, 0])).toEqual({ fx: 3, fy: 0, mz: -5, relative: 1 });
  });

  it("is reported with every analysed load case, near rounding", () => {
    const result = analyzeOrThrow(
      lineBeam(
        [4, 6],
        ["pin", "roller", "roller"],
        [{ kind: "distributed", member: "m2", direction: "global-y", wStart: -5e3, wEnd: -5e3 }],
      ),
    );
    const { equilibrium } = result.loadCases.L;
    expect(Math.abs(equilibrium.fy)).toBeLessThan(1e-9 * 30e3);
    expect(equilibrium.relative).toBeLessThan(1e-12);
  });
});
