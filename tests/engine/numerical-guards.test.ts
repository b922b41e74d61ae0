/**
 * Finite inputs whose arithmetic overflows are stopped with a sentence at the stage where the overflow first
 * appears — the stiffness matrix, a load case's loads, its solution, or a combined result — so that neither
 * NaN nor Infinity ever leaves the engine (common practice: guard floating-point overflow, IEEE 754).
 */
import { describe, expect, it } from "vitest";
import { analyze, linearSystem, type ModelInput } from "@/lib/engine";

/** A 2 m cantilever (fixed at a, free at b) with load cases P and Q, each a tip load `fy`. */
function cantilever(E: number, fy: number, extra: Partial<ModelInput> = {}): ModelInput {
  return {
    nodes: [
      { id: "a", x: 0, y: 0, support: { ux: "fixed", uy: "fixed", rz: "fixed" } },
      { id: "b", x: 2, y: 0 },
    ],
    members: [{ id: "m", start: "a", end: "b", E, A: 1e-2, I: 1e-4 }],
    loadCases: [
      { id: "P", loads: [{ kind: "nodal", node: "b", fy }] },
      { id: "Q", loads: [{ kind: "nodal", node: "b", fy }] },
    ],
    ...extra,
  };
}

/** E·I/L³ past the largest double: E = 1e306 Pa with I = 1e5 m⁴. */
function overflowingStiffness(): ModelInput {
  const model = cantilever(1e306, -1e3);
  model.members = [{ ...model.members![0], I: 1e5 }];
  return model;
}

function errorsOf(model: unknown) {
  const out = analyze(model);
  if (out.ok) throw new Error("expected the analysis to refuse the model");
  return out.errors;
}

const STIFFNESS_OVERFLOW = {
  kind: "numerical",
  message: "The stiffness matrix overflows; check the magnitudes of E, A, I and spring stiffnesses (SI units: Pa, m², m⁴)",
};
const LOADS_OVERFLOW = {
  kind: "numerical",
  message: "Load case P: the loads overflow; check their magnitudes (SI units: N, N/m, N·m)",
};

describe("overflow is stopped where it first appears", () => {
  it("in the stiffness matrix", () => {
    expect(errorsOf(overflowingStiffness())).toEqual([STIFFNESS_OVERFLOW]);
  });

  it("in the nodal loads of a case, though every fixed-end force is finite", () => {
    // Two tip loads of 1.7e308 N each sum past the largest double (≈ 1.798e308).
    const model = cantilever(200e9, -1);
    model.loadCases = [
      {
        id: "P",
        loads: [
          { kind: "nodal", node: "b", fy: 1.7e308 },
          { kind: "nodal", node: "b", fy: 1.7e308 },
        ],
      },
    ];
    expect(errorsOf(model)).toEqual([LOADS_OVERFLOW]);
  });

  it("in the fixed-end forces of a span load", () => {
    const model = cantilever(200e9, -1);
    model.loadCases = [{ id: "P", loads: [{ kind: "distributed", member: "m", direction: "global-y", wStart: -1e308 }] }];
    expect(errorsOf(model)).toEqual([LOADS_OVERFLOW]);
  });

  it("in the solution of a case: a stiffness so small that u = P/k overflows", () => {
    expect(errorsOf(cantilever(1e-300, 1e10))).toEqual([
      { kind: "numerical", message: "Load case P: the solution is not finite; check for extreme stiffness ratios" },
    ]);
  });

  it("in a combination whose displacements overflow while its forces stay finite", () => {
    // E = 1e-250 Pa: tip deflection PL³/3EI ≈ 2.7e254 m per newton; × 1e100 per case overflows, the forces do not.
    const model = cantilever(1e-250, -1, { combinations: [{ id: "C", factors: { P: 1e100, Q: 1e100 } }] });
    expect(errorsOf(model)).toEqual([
      { kind: "numerical", message: "Result C is not finite; check for extreme stiffness ratios" },
    ]);
  });

  it("in a combination whose forces overflow while its displacements stay finite", () => {
    // P = 1e300 N on a steel cantilever: deflections ≈ 1.3e293 m; × 1e10 the forces overflow, the deflections not.
    const model = cantilever(200e9, -1e300, { combinations: [{ id: "C", factors: { P: 1e10 } }] });
    expect(errorsOf(model)).toEqual([
      { kind: "numerical", message: "Result C is not finite; check for extreme stiffness ratios" },
    ]);
  });

  it("the same combinations with ordinary factors analyse", () => {
    expect(analyze(cantilever(1e-250, -1, { combinations: [{ id: "C", factors: { P: 1, Q: 1 } }] })).ok).toBe(true);
    expect(analyze(cantilever(200e9, -1e300, { combinations: [{ id: "C", factors: { P: 1 } }] })).ok).toBe(true);
  });
});

describe("linearSystem stops at the same errors as analyze", () => {
  it("an invalid model", () => {
    const out = linearSystem(null);
    expect(out.ok).toBe(false);
    if (!out.ok) expect(out.errors[0]).toMatchObject({ kind: "invalid-model" });
  });

  it("a stiffness matrix that overflows", () => {
    expect(linearSystem(overflowingStiffness())).toEqual({ ok: false, errors: [STIFFNESS_OVERFLOW] });
  });

  it("loads that overflow", () => {
    const model = cantilever(200e9, -1);
    model.loadCases = [{ id: "P", loads: [{ kind: "distributed", member: "m", direction: "global-y", wStart: -1e308 }] }];
    expect(linearSystem(model)).toEqual({ ok: false, errors: [LOADS_OVERFLOW] });
  });

  it("a sound model: K over the free equations and one right-hand side per case", () => {
    const out = linearSystem(cantilever(200e9, -1e3));
    if (!out.ok) throw new Error("the model should assemble");
    expect(out.system.K?.n).toBe(3);
    expect(out.system.rhs.map((r) => Array.from(r))).toEqual([
      [0, -1e3, 0],
      [0, -1e3, 0],
    ]);
  });
});

describe("a structure with no free equation", () => {
  it("is analysed with an empty factor: zero equations, zero entries in L", () => {
    const fixed = { ux: "fixed", uy: "fixed", rz: "fixed" } as const;
    const out = analyze({
      nodes: [
        { id: "a", x: 0, y: 0, support: fixed },
        { id: "b", x: 2, y: 0, support: fixed },
      ],
      members: [{ id: "m", start: "a", end: "b", E: 200e9, A: 1e-2, I: 1e-4 }],
      loadCases: [{ id: "P", loads: [{ kind: "distributed", member: "m", direction: "global-y", wStart: -1e3 }] }],
    });
    if (!out.ok) throw new Error("the model should analyse");
    expect(out.result.stats).toEqual({ nodes: 2, members: 1, equations: 0, nnzL: 0 });
    // Fixed–fixed, w = 1 kN/m over 2 m: each end carries wL/2 = 1 kN (AWC Design Aid No. 6, 2005, Fig. 23).
    expect(out.result.loadCases.P.reactions[1]).toBeCloseTo(1e3, 9);
  });
});
