/**
 * Evaluation: inputs in any unit give the same answer, the output is canonical and repeatable byte for byte,
 * utilisations round up, and a check for each member finds where it governs on the forces acting together.
 */
import { describe, expect, it } from "vitest";
import { displayUtilisation, evaluationToCanonicalJson } from "@/lib/standards";
import { beamDefinition, compileOrThrow, sourceOf } from "./helpers";
import { expectClose } from "../engine/helpers";

const beam = compileOrThrow(sourceOf(beamDefinition()));

function evaluationOf(inputs: Record<string, string | number>) {
  const out = beam.evaluate(inputs);
  if (!out.ok) throw new Error(JSON.stringify(out));
  return out.evaluation;
}

describe("a simply supported beam under uniform load", () => {
  it("gives M = wL²/8 at midspan (AWC Design Aid No. 6, 2005, Fig. 1)", () => {
    const e = evaluationOf({ L: "6 m", w: "10 kN/m" });
    expectClose(e.extracts.M_max.si, (10e3 * 36) / 8, 1e-12);
    expect(e.extracts.M_max.display).toBe("45.0 kN·m");
    expect(e.extracts.M_max.where).toEqual({ member: "beam", x: expect.closeTo(3, 12), under: "W" });
    expect(e.checks.bending).toMatchObject({ demand: "45.0 kN·m", capacity: "300 kN·m", utilisationShown: "0.15", pass: true });
  });

  it("the same beam typed in US units gives the same moment", () => {
    // 6 m = 19.685… ft; 10 kN/m = 685.2… plf (NIST SP 811 factors, exact).
    const us = evaluationOf({ L: `${6 / 0.3048} ft`, w: `${(10e3 * 0.3048) / (0.45359237 * 9.80665)} plf` });
    expectClose(us.extracts.M_max.si, 45e3, 1e-12);
    expect(us.inputs.L.typed).toBe(`${6 / 0.3048} ft`);
    expectClose(us.inputs.L.si as number, 6, 1e-14);
  });

  it("records inputs as typed and in SI, and the identity of what computed them", () => {
    const e = evaluationOf({ L: "19.7 ft" });
    expect(e.inputs.L).toEqual({ typed: "19.7 ft", si: expect.closeTo(6.00456, 12), display: "6.005 m" });
    expect(e.inputs.w).toEqual({ typed: "10 kN/m", si: 10e3, display: "10 kN/m" });
    expect(e.identity).toEqual({
      engine: expect.stringMatching(/^\d+\.\d+\.\d+$/),
      engineSourceHash: expect.stringMatching(/^[0-9a-f]{64}$/),
      evaluation: "0.2.0",
    });
  });

  it("bad inputs are refused by name, all at once, with nothing evaluated", () => {
    const out = beam.evaluate({ L: "0.5 m", w: "3 kN", X: "1" });
    expect(out).toEqual({
      ok: false,
      stage: "inputs",
      problems: [
        { input: "X", message: "There is no input `X` in this standard" },
        { input: "w", message: expect.stringMatching(/^Load: 3 kN is a force/) },
      ],
    });
    expect(beam.evaluate({ L: "0.5 m" })).toEqual({
      ok: false,
      stage: "inputs",
      problems: [{ input: "L", message: "Span: 0.5 m is below the minimum 1 m" }],
    });
  });
});

describe("canonical output", () => {
  it("the same inputs give the same bytes, with keys in canonical order", () => {
    const a = evaluationToCanonicalJson(evaluationOf({ L: "7 m" }));
    const b = evaluationToCanonicalJson(evaluationOf({ L: "7 m" }));
    expect(a).toBe(b);
    expect(a.indexOf('"checks"')).toBeLessThan(a.indexOf('"derived"'));
    expect(a).not.toMatch(/\s"|":\s/);
    expect(a).not.toMatch(/NaN|Infinity/);
  });
});

describe("utilisations round up", () => {
  it.each([
    [1.004, "1.01"],
    [1.0000001, "1.01"],
    [1, "1.00"],
    [0.999, "1.00"],
    [0.3091, "0.31"],
    [0.31, "0.31"],
  ])("%s shows as %s", (u, shown) => {
    expect(displayUtilisation(u)).toBe(shown);
  });

  it("a check just over its capacity fails and never shows 1.00", () => {
    // M = wL²/8 = 45 kN·m at w = 10 kN/m, L = 6 m; a capacity of 44.8 kN·m gives 1.0045.
    const d = beamDefinition() as { derived: { M_cap: { expr: string } } };
    d.derived.M_cap.expr = "44.8 kN m";
    const out = compileOrThrow(sourceOf(d)).evaluate();
    if (!out.ok) throw new Error(JSON.stringify(out));
    expect(out.evaluation.checks.bending).toMatchObject({ utilisationShown: "1.01", pass: false, message: "too big" });
    expect(out.evaluation.pass).toBe(false);
  });
});

describe("a check for each member", () => {
  it("runs per member and combination at the sections where forces act together, and names where it governs", () => {
    // Two equal spans of 6 m under 10 kN/m: the interior support moment wL²/8 = 45 kN·m governs over the
    // span moments 9wL²/128 = 25.3 kN·m (AWC Design Aid No. 6, 2005, Fig. 29).
    const d = beamDefinition() as Record<string, any>; // eslint-disable-line @typescript-eslint/no-explicit-any
    d.model.nodes = [
      { id: "A", x: "0 m", y: "0 m", support: "pinned" },
      { id: "B", x: "L", y: "0 m", support: "roller-x" },
      { id: "C", x: "2 * L", y: "0 m", support: "roller-x" },
    ];
    d.model.members = [
      { id: "AB", start: "A", end: "B", E: "E", A: "5000 mm^2", I: "I", group: "beams" },
      { id: "BC", start: "B", end: "C", E: "E", A: "5000 mm^2", I: "I", group: "beams" },
    ];
    d.model.load_cases = [
      { id: "W", loads: [{ each: { s: ["AB", "BC"] }, member: "{s}", direction: "global-y", w: "-w" }] },
      { id: "W1", loads: [{ member: "AB", direction: "global-y", w: "-w" }] },
    ];
    d.model.combinations = [
      { id: "both", factors: { W: 1 } },
      { id: "first", factors: { W1: 1 } },
    ];
    d.checks.bending = {
      label: "Bending at each section",
      demand: "abs(M) + abs(N) * 0 m",
      capacity: "M_cap",
      clause: "test",
      fails: "too big",
      unit: "kN m",
      for_each: { members: "beams", under: "all_combinations" },
    };
    const out = compileOrThrow(sourceOf(d)).evaluate();
    if (!out.ok) throw new Error(JSON.stringify(out));
    const check = out.evaluation.checks.bending;
    expectClose(check.demandSI, 45e3, 1e-9);
    expect(check.where).toEqual({ member: expect.stringMatching(/^(AB|BC)$/), x: expect.any(Number), under: "both" });
    expect([0, 6]).toContainEqual(expect.closeTo(check.where!.x!, 9));
    // 2 members × 2 combinations × (sampled points + both sides of the extremes of N, V and M).
    expect(check.sectionsChecked).toBeGreaterThanOrEqual(4 * 21);
  });
});
