/**
 * Whole-structure mechanisms are named as such (lib/engine/rigid-body.ts): a plane structure whose supports
 * leave x, y or rotation free, or whose reactions are all concurrent or all parallel, moves as a rigid body
 * (common practice: improper supports). Local mechanisms keep the node-and-direction message.
 */
import { describe, expect, it } from "vitest";
import { analyze, type ModelInput } from "@/lib/engine";
import { A, E, I } from "./helpers";

type Support = NonNullable<ModelInput["nodes"][number]["support"]>;

function errorsOf(model: ModelInput) {
  const out = analyze(model);
  if (out.ok) throw new Error("expected the analysis to refuse the model");
  return out.errors;
}

/** A triangle truss A(0,0) – B(6,0) – C(3,4) with the given supports and a load at C. */
function triangle(supports: { A?: Support; B?: Support; C?: Support }): ModelInput {
  const truss = (id: string, start: string, end: string) => ({ id, start, end, kind: "truss" as const, E, A });
  return {
    nodes: [
      { id: "A", x: 0, y: 0, support: supports.A },
      { id: "B", x: 6, y: 0, support: supports.B },
      { id: "C", x: 3, y: 4, support: supports.C },
    ],
    members: [truss("AB", "A", "B"), truss("BC", "B", "C"), truss("CA", "C", "A")],
    loadCases: [{ id: "P", loads: [{ kind: "nodal", node: "C", fy: -10e3 }] }],
  };
}

describe("the supports let the whole structure move", () => {
  it("no support in x: it slides in x", () => {
    expect(errorsOf(triangle({ A: { uy: "fixed" }, B: { uy: "fixed" } }))).toEqual([
      { kind: "rigid-body", motion: "slide-x", message: "The structure can slide in x as a whole: no support restrains x" },
    ]);
  });

  it("no support in y: it slides in y", () => {
    expect(errorsOf(triangle({ A: { ux: "fixed" }, C: { ux: "fixed" } }))).toEqual([
      { kind: "rigid-body", motion: "slide-y", message: "The structure can slide in y as a whole: no support restrains y" },
    ]);
  });

  it("no support at all: it slides both ways and turns", () => {
    expect(errorsOf(triangle({})).map((e) => e.message)).toEqual([
      "The structure can slide in x as a whole: no support restrains x",
      "The structure can slide in y as a whole: no support restrains y",
      "The structure can turn as a whole about any point: no support restrains it",
    ]);
  });

  it("reactions concurrent at a point that is no node: it turns about that point", () => {
    // x held at C (line y = 4), y held at A (line x = 0): both reactions pass through (0, 4).
    expect(errorsOf(triangle({ A: { uy: "fixed" }, C: { ux: "fixed" } }))).toEqual([
      {
        kind: "rigid-body",
        motion: "turn",
        about: { x: 0, y: 4 },
        message:
          "The structure can turn as a whole about the point x = 0 m, y = 4 m: every support reaction acts through that point and nothing holds the structure in rotation",
      },
    ]);
  });

  it("x held on one line only: it slides in y and turns about that line", () => {
    const errors = errorsOf(triangle({ A: { ux: "fixed" }, B: { ux: "fixed" } }));
    expect(errors.map((e) => e.kind === "rigid-body" && e.motion)).toEqual(["slide-y", "turn"]);
    expect(errors[1]).toMatchObject({
      line: { y: 0 },
      message:
        "The structure can turn as a whole about any point of the line y = 0 m: every support reaction acts along that line and nothing holds the structure in rotation",
    });
  });

  it("y held on one vertical line only: it slides in x and turns about that line", () => {
    expect(errorsOf(triangle({ A: { uy: "fixed" } }))).toEqual([
      { kind: "rigid-body", motion: "slide-x", message: "The structure can slide in x as a whole: no support restrains x" },
      {
        kind: "rigid-body",
        motion: "turn",
        line: { x: 0 },
        message:
          "The structure can turn as a whole about any point of the line x = 0 m: every support reaction acts along that line and nothing holds the structure in rotation",
      },
    ]);
  });

  it("a single pin away from the origin: it turns about that node", () => {
    expect(errorsOf(triangle({ C: { ux: "fixed", uy: "fixed" } }))).toEqual([
      {
        kind: "rigid-body",
        motion: "turn",
        about: { x: 3, y: 4 },
        node: "C",
        message:
          "The structure can turn as a whole about node C (x = 3 m, y = 4 m): every support reaction acts through that point and nothing holds the structure in rotation",
      },
    ]);
  });

  it("coordinates that differ by round-off relative to the model's size lie on one line", () => {
    // B sits 5e-12 m above A's level on a model 6 m across (about 1e-12 of its size): the x restraints at A and
    // B act along one line through A, so the pin at A and the x roller at B let it turn about A.
    const model = triangle({ A: { ux: "fixed", uy: "fixed" }, B: { ux: "fixed" } });
    model.nodes[1] = { ...model.nodes[1], y: 5e-12 };
    expect(errorsOf(model)).toEqual([
      expect.objectContaining({ kind: "rigid-body", motion: "turn", about: { x: 0, y: 0 }, node: "A" }),
    ]);
  });

  it("the same round-off on a model far from the origin, in negative coordinates", () => {
    // The tolerance scales with the largest |coordinate|, here 60 m: 5e-11 m is round-off there too.
    const model = triangle({ A: { ux: "fixed", uy: "fixed" }, B: { ux: "fixed" } });
    model.nodes = model.nodes.map((n) => ({ ...n, x: n.x - 60, y: n.y - 40 }));
    model.nodes[1] = { ...model.nodes[1], y: -40 + 5e-11 };
    expect(errorsOf(model)).toEqual([
      expect.objectContaining({ kind: "rigid-body", motion: "turn", about: { x: -60, y: -40 }, node: "A" }),
    ]);
  });

  it("a rotational support at a truss node holds nothing in rotation", () => {
    const errors = errorsOf(triangle({ A: { ux: "fixed", uy: "fixed", rz: "fixed" } }));
    expect(errors).toEqual([expect.objectContaining({ kind: "rigid-body", motion: "turn", node: "A" })]);
  });

  it("a support at a node no member reaches holds nothing", () => {
    const model = triangle({ A: { uy: "fixed" }, B: { uy: "fixed" } });
    model.nodes.push({ id: "loose", x: 9, y: 9, support: { ux: "fixed", uy: "fixed", rz: "fixed" } });
    expect(errorsOf(model)).toEqual([expect.objectContaining({ kind: "rigid-body", motion: "slide-x" })]);
  });
});

describe("supports that hold the whole structure", () => {
  it("a pin and a roller at another x: analysed", () => {
    expect(analyze(triangle({ A: { ux: "fixed", uy: "fixed" }, B: { uy: "fixed" } })).ok).toBe(true);
  });

  it("a single fixed base of a frame member (a cantilever): analysed", () => {
    const model: ModelInput = {
      nodes: [
        { id: "A", x: 0, y: 0, support: { ux: "fixed", uy: "fixed", rz: "fixed" } },
        { id: "B", x: 0, y: 3 },
      ],
      members: [{ id: "AB", start: "A", end: "B", E, A, I }],
      loadCases: [{ id: "H", loads: [{ kind: "nodal", node: "B", fx: 1e3 }] }],
    };
    expect(analyze(model).ok).toBe(true);
  });

  it("a fixed support at the end node of a member holds the structure in rotation", () => {
    // The member runs from the free tip to the fixed base, so the base is the member's end node.
    const model: ModelInput = {
      nodes: [
        { id: "tip", x: 0, y: 3 },
        { id: "base", x: 0, y: 0, support: { ux: "fixed", uy: "fixed", rz: "fixed" } },
      ],
      members: [{ id: "column", start: "tip", end: "base", E, A, I }],
      loadCases: [{ id: "H", loads: [{ kind: "nodal", node: "tip", fx: 1e3 }] }],
    };
    expect(analyze(model).ok).toBe(true);
  });

  it("a model with no members: a free node is named, not the whole structure", () => {
    const out = analyze({ nodes: [{ id: "a", x: 0, y: 0 }], members: [], loadCases: [{ id: "P", loads: [] }] });
    expect(out.ok ? [] : out.errors).toEqual([
      { kind: "unstable", node: "a", direction: "ux", message: "Node a is free to move in x (mechanism or missing support)" },
    ]);
  });

  it("springs count as supports", () => {
    const spring = { kind: "spring" as const, stiffness: 1e6 };
    expect(analyze(triangle({ A: { ux: spring, uy: spring }, B: { uy: spring } })).ok).toBe(true);
  });

  it("a local mechanism is still named by node and direction", () => {
    // Pinned bases at different x hold the whole; a beam hinged at both knees lets the portal sway.
    const model: ModelInput = {
      nodes: [
        { id: "A", x: 0, y: 0, support: { ux: "fixed", uy: "fixed" } },
        { id: "B", x: 0, y: 4 },
        { id: "C", x: 8, y: 4 },
        { id: "D", x: 8, y: 0, support: { ux: "fixed", uy: "fixed" } },
      ],
      members: [
        { id: "AB", start: "A", end: "B", E, A, I },
        { id: "BC", start: "B", end: "C", E, A, I, releases: { startMoment: true, endMoment: true } },
        { id: "DC", start: "D", end: "C", E, A, I },
      ],
      loadCases: [{ id: "W", loads: [{ kind: "nodal", node: "B", fx: 1e3 }] }],
    };
    const errors = errorsOf(model);
    expect(errors).toEqual([expect.objectContaining({ kind: "unstable" })]);
    expect(errors[0].message).toMatch(/^Node [BC] is free to (move in [xy]|rotate) \(mechanism or missing support\)$/);
  });
});
