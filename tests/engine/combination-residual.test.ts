/**
 * The solver residual a load combination reports, ‖K·u − f‖ / ‖f‖ for its factored displacements and
 * right-hand side (common practice: the relative residual of a linear solve). A combination of one case at a
 * factor of 1 is that case exactly, so it must report the very same residual; a structure with no free
 * equations has nothing to solve and reports 0.
 */
import { describe, expect, it } from "vitest";
import type { ModelInput } from "@/lib/engine";
import { analyzeOrThrow, lineBeam, slenderChain } from "./helpers";

function cantileverChain(): ModelInput {
  const chain = slenderChain(1);
  return {
    ...chain,
    loadCases: [...chain.loadCases!, { id: "B", loads: [{ kind: "nodal", node: "n10", fx: 0, fy: -3e3, mz: 2e3 }] }],
    combinations: [
      { id: "C1", factors: { A: 1 } },
      { id: "C2", factors: { A: 1.35, B: 1.5 } },
    ],
  };
}

describe("combination solver residual", () => {
  it("a combination of one case at factor 1 reports that case's residual; a mixed one reports its own", () => {
    const r = analyzeOrThrow(cantileverChain());
    const a = r.loadCases.A.relativeResidual;
    // A 20-member chain leaves a round-off residual that is not zero, so a combination that skipped the
    // check (and reported 0) is seen.
    expect(a).toBeGreaterThan(0);
    expect(a).toBeLessThan(1e-9);
    expect(r.combinations.C1.relativeResidual).toBe(a);
    expect(r.combinations.C2.relativeResidual).toBeGreaterThan(0);
    expect(r.combinations.C2.relativeResidual).toBeLessThan(1e-9);
  });

  it("a structure with no free equations reports 0 for a combination", () => {
    const model = lineBeam([3], ["fixed", "fixed"], [{ kind: "distributed", member: "m1", direction: "local-y", wStart: -2e3 }]);
    model.combinations = [{ id: "C", factors: { L: 1.5 } }];
    const r = analyzeOrThrow(model);
    expect(r.combinations.C.relativeResidual).toBe(0);
    expect(r.combinations.C.reactions.every(Number.isFinite)).toBe(true);
  });
});
