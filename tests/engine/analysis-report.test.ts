/**
 * What analyze() reports beside the numbers: the stage timings (each a part of the whole, none negative) and the
 * warning for a load case whose solve leaves a large relative residual ‖Ku − f‖ / ‖f‖ (common practice: a
 * residual far above rounding means the structure is close to a mechanism).
 */
import { describe, expect, it } from "vitest";
import { analyze } from "@/lib/engine";
import { slenderChain } from "./helpers";

describe("analysis report", () => {
  it("times each stage: none negative, the stages within the whole, the whole within the wall clock", () => {
    const started = performance.now();
    const out = analyze(slenderChain(1));
    const wall = performance.now() - started;
    if (!out.ok) throw new Error("the model should analyse");
    const { totalMs, ...stages } = out.timings;
    for (const [stage, ms] of Object.entries(stages)) {
      expect(ms, stage).toBeGreaterThanOrEqual(0);
      expect(ms, stage).toBeLessThanOrEqual(totalMs);
    }
    const measuredHere = stages.validationMs + stages.assemblyMs + stages.solveMs + stages.recoveryMs;
    expect(measuredHere).toBeLessThanOrEqual(totalMs + 1e-9);
    expect(totalMs).toBeLessThanOrEqual(wall);
  });

  it("warns of a load case whose relative residual is above 1e-6, naming it and the residual", () => {
    const out = analyze(slenderChain(1e3));
    if (!out.ok) throw new Error("the model should analyse");
    const residual = out.result.loadCases.A.relativeResidual;
    expect(residual).toBeGreaterThan(1e-6);
    expect(out.result.warnings).toEqual([
      {
        kind: "ill-conditioned",
        loadCase: "A",
        relativeResidual: residual,
        message: `Load case A: relative residual ${residual.toExponential(2)}; the structure may be nearly a mechanism`,
      },
    ]);
  });

  it("gives no warning when the residual is at rounding", () => {
    const out = analyze(slenderChain(1));
    if (!out.ok) throw new Error("the model should analyse");
    expect(out.result.loadCases.A.relativeResidual).toBeLessThan(1e-6);
    expect(out.result.warnings).toEqual([]);
  });
});
