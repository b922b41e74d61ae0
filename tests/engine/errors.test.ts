/** Errors come back as data a person can act on; NaN and Infinity never leave the engine. */
import { describe, it, expect } from "vitest";
import { analyze, memberDiagram, memberEnvelope, type ModelInput } from "@/lib/engine";
import { expectAllFinite, expectClose, lineBeam, E, I } from "./helpers";
import { randomFrame } from "./random-frames";

function errorsOf(model: unknown) {
  const out = analyze(model);
  if (out.ok) throw new Error("expected the analysis to fail");
  return out.errors;
}

describe("unstable structures", () => {
  it("names the node and direction of a mechanism", () => {
    // B hangs between two collinear truss members: nothing holds it in y, though the supports hold the whole.
    const errors = errorsOf({
      nodes: [
        { id: "A", x: 0, y: 0, support: { ux: "fixed", uy: "fixed" } },
        { id: "B", x: 3, y: 0 },
        { id: "C", x: 6, y: 0, support: { uy: "fixed" } },
      ],
      members: [
        { id: "AB", start: "A", end: "B", kind: "truss", E, A: 1e-3 },
        { id: "BC", start: "B", end: "C", kind: "truss", E, A: 1e-3 },
      ],
      loadCases: [{ id: "L", loads: [{ kind: "nodal", node: "B", fx: 1e3 }] }],
    });
    expect(errors).toEqual([
      { kind: "unstable", node: "B", direction: "uy", message: "Node B is free to move in y (mechanism or missing support)" },
    ]);
  });

  it("a beam on rollers only slides in x as a whole", () => {
    const errors = errorsOf(lineBeam([5], ["roller", "roller"], []));
    expect(errors).toEqual([expect.objectContaining({ kind: "rigid-body", motion: "slide-x" })]);
  });

  it("a moment on a node nothing can turn is reported at that node", () => {
    const model = lineBeam([4, 4], ["pin", "free", "pin"], [{ kind: "nodal", node: "n1", mz: 5e3 }]);
    model.members = model.members!.map((m) => ({ ...m, kind: "truss" as const }));
    expect(errorsOf(model)[0]).toMatchObject({ kind: "unstable", node: "n1", direction: "rz" });
  });

  it("a frame held only in y slides in x as a whole: reported, not solved", () => {
    const model = randomFrame(7);
    model.nodes = model.nodes.map((n) => (n.support ? { ...n, support: { uy: "fixed" } } : n));
    expect(errorsOf(model)).toEqual([expect.objectContaining({ kind: "rigid-body", motion: "slide-x" })]);
  });
});

describe("invalid models", () => {
  const good = (): ModelInput =>
    lineBeam([5], ["pin", "roller"], [{ kind: "distributed", member: "m1", direction: "global-y", wStart: -1e3 }]);

  it("zero-length member", () => {
    const model = good();
    model.nodes[1] = { ...model.nodes[1], x: 0 };
    expect(errorsOf(model)).toContainEqual(expect.objectContaining({ kind: "zero-length-member", member: "m1" }));
  });

  it("non-positive and missing properties", () => {
    const model = good();
    model.members = [{ id: "m1", start: "n0", end: "n1", E: 0, A: -1 }];
    const errors = errorsOf(model);
    expect(errors).toContainEqual(expect.objectContaining({ kind: "non-positive-property", path: "members[0].E" }));
    expect(errors).toContainEqual(expect.objectContaining({ kind: "non-positive-property", path: "members[0].A" }));
    expect(errors).toContainEqual(expect.objectContaining({ kind: "missing-property", member: "m1", property: "I" }));
  });

  it("loads on members and nodes that do not exist, and loads off the member", () => {
    const model = good();
    model.loadCases = [
      {
        id: "L",
        loads: [
          { kind: "distributed", member: "nope", direction: "global-y", wStart: -1 },
          { kind: "nodal", node: "ghost", fy: 1 },
          { kind: "point", member: "m1", direction: "local-y", position: 7, value: 1 },
        ],
      },
    ];
    const errors = errorsOf(model);
    expect(errors).toContainEqual(
      expect.objectContaining({ kind: "unknown-member", member: "nope", path: "loadCases[0].loads[0].member" }),
    );
    expect(errors).toContainEqual(expect.objectContaining({ kind: "unknown-node", node: "ghost" }));
    expect(errors).toContainEqual(expect.objectContaining({ kind: "load-outside-member", member: "m1" }));
  });

  it("members on missing nodes, duplicate ids, unknown cases in combinations and envelopes", () => {
    const model = good();
    model.members = [...model.members!, { id: "m1", start: "n0", end: "n9", E, A: 1, I }];
    model.combinations = [{ id: "C", factors: { X: 1 } }];
    model.envelopes = [{ id: "E", of: ["Y"] }];
    const kinds = errorsOf(model).map((e) => e.kind);
    expect(kinds).toEqual(expect.arrayContaining(["unknown-node", "duplicate-id", "unknown-load-case", "unknown-result"]));
  });

  it("non-finite numbers are named by path", () => {
    const model = good();
    model.nodes[1] = { ...model.nodes[1], x: NaN };
    model.members = [{ ...model.members![0], E: Infinity }];
    const errors = errorsOf(model);
    expect(errors).toContainEqual(expect.objectContaining({ kind: "non-finite", path: "nodes[1].x" }));
    expect(errors).toContainEqual(expect.objectContaining({ kind: "non-finite", path: "members[0].E" }));
  });

  it("finite inputs that overflow are reported, not thrown or returned as NaN", () => {
    const stiff = good();
    stiff.members = [{ ...stiff.members![0], E: 1e306, I: 1e5 }];
    expect(errorsOf(stiff)[0].kind).toBe("numerical");
    const heavy = good();
    heavy.loadCases = [{ id: "L", loads: [{ kind: "distributed", member: "m1", direction: "global-y", wStart: -1e307 }] }];
    expect(errorsOf(heavy)[0].kind).toBe("numerical");
  });

  it("shape errors from the schema carry a path", () => {
    const errors = errorsOf({ nodes: [{ id: "a", x: "1", y: 0 }] });
    expect(errors[0]).toMatchObject({ kind: "invalid-model", path: "nodes[0].x" });
    expect(errorsOf(null)[0].kind).toBe("invalid-model");
  });

  it("every error has a message", () => {
    const errors = errorsOf({
      nodes: [
        { id: "a", x: 0, y: 0 },
        { id: "a", x: 0, y: 0 },
      ],
      members: [{ id: "m", start: "a", end: "b", E: -1, A: 1 }],
    });
    // A duplicate node id, an unknown end node, a negative E and a missing I at least.
    expect(errors.length).toBeGreaterThanOrEqual(4);
    for (const e of errors) expect(e.message.length).toBeGreaterThan(10);
  });
});

describe("no NaN or Infinity in any output", () => {
  it("results, diagrams and envelopes of random frames are finite (checked recursively)", () => {
    for (const seed of [3, 11, 29]) {
      const model = randomFrame(seed, { releases: true });
      model.combinations = [{ id: "C", factors: { L: 1.5 } }];
      model.envelopes = [{ id: "E", of: ["L", "C"] }];
      model.members = model.members!.map((m) => ({ ...m, cTop: 0.15, cBottom: 0.15 }));
      const out = analyze(model);
      expect(out.ok).toBe(true);
      if (!out.ok) return;
      expectAllFinite(out.result);
      expect(out.result.memberIds.length).toBeGreaterThan(0);
      for (const id of out.result.memberIds) {
        const d = memberDiagram(out.result, id, "C", { points: 7 });
        expectAllFinite({ extremes: d.extremes, samples: d.samples, at: d.valueAt(1) });
        expectAllFinite(memberEnvelope(out.result, id, "E", { points: 5 }));
      }
    }
  });

  it("a structure with no free equations and no loads still gives finite zeros", () => {
    const out = analyze(lineBeam([3], ["fixed", "fixed"], []));
    expect(out.ok).toBe(true);
    if (out.ok) expectAllFinite(out.result);
  });

  it("an empty load case gives a zero residual, not NaN", () => {
    const out = analyze(lineBeam([3], ["pin", "roller"], []));
    expect(out.ok && out.result.loadCases.L.relativeResidual).toBe(0);
  });
});

describe("truss member without I", () => {
  it("has no stress or bending deflection to report, and says so by omitting them", () => {
    const out = analyze({
      nodes: [
        { id: "A", x: 0, y: 0, support: { ux: "fixed", uy: "fixed" } },
        { id: "B", x: 3, y: 4, support: { ux: "fixed", uy: "fixed" } },
      ],
      members: [{ id: "AB", start: "A", end: "B", kind: "truss", E, A: 1e-3, cTop: 0.1, density: 7850 }],
      loadCases: [{ id: "G", loads: [{ kind: "self-weight" }] }],
    });
    expect(out.ok).toBe(true);
    if (!out.ok) return;
    const d = memberDiagram(out.result, "AB", "G");
    expect(d.quantities).not.toContain("stressTop");
    // The member spans between pins like a simply supported beam under the weight's component across it, ρAg·cosα
    // with cosα = 3/5 (statics, common practice; AWC Design Aid No. 6 (2005), Figure 1: M_max = wl²/8 at the centre):
    // 7850 · 1e-3 · 9.80665 · 0.6 · 5² / 8 = 144.34 N·m.
    const across = 7850 * 1e-3 * 9.80665 * (3 / 5);
    expectClose(d.extremes.M!.max.value, (across * 25) / 8);
    expectClose(d.extremes.M!.max.x, 2.5);
    expectClose(d.extremes.M!.max.value, 144.34, 1e-4);
    expectAllFinite(d.samples);
  });
});
