/**
 * validateModel at its edges: every error of a model with several faults, in order; the tolerances of member
 * length and load position on either side; the properties checked only when present; the shortcuts that skip
 * work for a valid model. The tolerances are the engine's own choices (common practice), not a standard's.
 */
import { describe, expect, it } from "vitest";
import { validateModel } from "@/lib/engine/validate";
import { A, E, I } from "./helpers";

type Model = {
  nodes: { id: string; x: number; y: number; support?: Record<string, unknown> }[];
  members: Record<string, unknown>[];
  loadCases: { id: string; loads: Record<string, unknown>[] }[];
  combinations?: Record<string, unknown>[];
  envelopes?: Record<string, unknown>[];
};

/** A valid two-node beam from (x0, 0) to (x0 + L, 0): fixed at A, on a roller at B. */
function beam(L = 4, x0 = 0): Model {
  return {
    nodes: [
      { id: "A", x: x0, y: 0, support: { ux: "fixed", uy: "fixed", rz: "fixed" } },
      { id: "B", x: x0 + L, y: 0, support: { uy: "fixed" } },
    ],
    members: [{ id: "AB", start: "A", end: "B", E, A, I }],
    loadCases: [{ id: "D", loads: [] }],
  };
}

function errorsOf(model: unknown) {
  const out = validateModel(model);
  if (out.ok) throw new Error("expected validateModel to refuse the model");
  return out.errors;
}

function accepts(model: unknown): void {
  const out = validateModel(model);
  if (!out.ok) throw new Error(JSON.stringify(out.errors));
}

const point = (position: number, member = "AB") => ({ kind: "point", member, direction: "global-y", position, value: -1 });

describe("non-finite numbers", () => {
  it("are each named by their path, in the order of the input, nested arrays and objects included", () => {
    const model = beam();
    model.nodes[1].y = -Infinity;
    model.loadCases[0].loads.push({ kind: "nodal", node: "B", fx: 1, fy: NaN }, point(NaN));
    model.nodes[0].support = { ux: "fixed", uy: { kind: "spring", stiffness: Infinity } };
    expect(errorsOf(model)).toEqual([
      {
        kind: "non-finite",
        path: "nodes[0].support.uy.stiffness",
        message: "nodes[0].support.uy.stiffness is Infinity; every number must be finite",
      },
      { kind: "non-finite", path: "nodes[1].y", message: "nodes[1].y is -Infinity; every number must be finite" },
      {
        kind: "non-finite",
        path: "loadCases[0].loads[0].fy",
        message: "loadCases[0].loads[0].fy is NaN; every number must be finite",
      },
      {
        kind: "non-finite",
        path: "loadCases[0].loads[1].position",
        message: "loadCases[0].loads[1].position is NaN; every number must be finite",
      },
    ]);
  });

  it("are found in arrays of numbers too, and only non-finite numbers are reported, not the other shape errors", () => {
    // A number inside an array the schema does not expect: the schema refuses it, the walk names the NaN.
    const model = { ...beam(), envelopes: [{ id: "E", of: ["D", NaN, null, "D"] }] };
    expect(errorsOf(model)).toEqual([
      { kind: "non-finite", path: "envelopes[0].of[1]", message: "envelopes[0].of[1] is NaN; every number must be finite" },
    ]);
  });

  it("a shape error without a path is given as the schema says it", () => {
    expect(errorsOf(7)).toEqual([
      { kind: "invalid-model", path: "", message: "Invalid input: expected object, received number" },
    ]);
  });

  it("several unknown keys are listed together, with the keys that are valid there", () => {
    const model = beam();
    model.members[0].Ix = 1;
    model.members[0].area = 2;
    expect(errorsOf(model)).toEqual([
      {
        kind: "invalid-model",
        path: "members[0]",
        message:
          'members[0]: unknown keys "Ix", "area"; the valid keys here are id, start, end, kind, E, A, I, cTop, cBottom, density, releases',
      },
    ]);
  });
});

describe("duplicate ids", () => {
  it("are reported for every kind of entity, once per repeat, and a combination may not share a load case's id", () => {
    const model = beam();
    model.nodes.push({ id: "B", x: 9, y: 0 });
    model.members.push({ id: "AB", start: "A", end: "B", E, A, I }, { id: "AB", start: "B", end: "A", E, A, I });
    model.loadCases.push({ id: "D", loads: [] });
    model.combinations = [
      { id: "C", factors: { D: 1 } },
      { id: "C", factors: { D: 2 } },
    ];
    model.envelopes = [
      { id: "E", of: ["C"] },
      { id: "E", of: ["D"] },
    ];
    expect(errorsOf(model).map((e) => e.message)).toEqual([
      'Two nodes share the id "B"',
      'Two members share the id "AB"',
      'Two members share the id "AB"',
      'Two load-cases share the id "D"',
      'Two combinations share the id "C"',
      'Two envelopes share the id "E"',
    ]);
    expect(errorsOf(model).map((e) => [e.kind, "entity" in e ? e.entity : ""])).toEqual([
      ["duplicate-id", "node"],
      ["duplicate-id", "member"],
      ["duplicate-id", "member"],
      ["duplicate-id", "load-case"],
      ["duplicate-id", "combination"],
      ["duplicate-id", "envelope"],
    ]);
  });

  it("distinct ids in every list pass, however many", () => {
    const model = beam();
    model.loadCases.push({ id: "W", loads: [] });
    model.combinations = [
      { id: "C1", factors: { D: 1 } },
      { id: "C2", factors: { W: 1 } },
    ];
    model.envelopes = [
      { id: "E1", of: ["C1", "C2"] },
      { id: "E2", of: ["D", "W", "C1"] },
    ];
    accepts(model);
  });
});

describe("members", () => {
  it("a member on two nodes that do not exist names both ends; lengths and properties are still checked", () => {
    const model = beam();
    model.members.push({ id: "XY", start: "X", end: "Y", E, A, I: -2 });
    expect(errorsOf(model)).toEqual([
      {
        kind: "unknown-node",
        path: "members[1].start",
        node: "X",
        message: 'Member XY refers to node "X", which does not exist',
      },
      { kind: "unknown-node", path: "members[1].end", node: "Y", message: 'Member XY refers to node "Y", which does not exist' },
      {
        kind: "non-positive-property",
        path: "members[1].I",
        property: "I",
        value: -2,
        message: "members[1].I is -2; I must be greater than zero",
      },
    ]);
  });

  it("a member with only its start unknown names only the start", () => {
    const model = beam();
    model.members[0].start = "X";
    expect(errorsOf(model).map((e) => ("path" in e ? e.path : ""))).toEqual(["members[0].start"]);
  });

  it("each optional property is checked when present, even when E and A are fine; zero is refused", () => {
    for (const property of ["I", "cTop", "cBottom", "density"]) {
      for (const value of [0, -0.5]) {
        // A truss member without I, so that only the property under test asks for the check.
        const model = beam();
        if (property !== "I") model.members[0] = { id: "AB", start: "A", end: "B", kind: "truss", E, A };
        model.members[0][property] = value;
        expect(errorsOf(model)).toEqual([
          {
            kind: "non-positive-property",
            path: `members[0].${property}`,
            property,
            value,
            message: `members[0].${property} is ${value}; ${property} must be greater than zero`,
          },
        ]);
      }
    }
    const model = beam();
    Object.assign(model.members[0], { cTop: 0.1, cBottom: 0.2, density: 7850 });
    accepts(model);
  });

  it("E and A are each checked, and a truss member needs no I", () => {
    const model = beam();
    model.members[0] = { id: "AB", start: "A", end: "B", kind: "truss", E, A: 0 };
    expect(errorsOf(model).map((e) => e.message)).toEqual(["members[0].A is 0; A must be greater than zero"]);
    model.members[0] = { id: "AB", start: "A", end: "B", kind: "truss", E: -E, A };
    expect(errorsOf(model).map((e) => e.message)).toEqual([`members[0].E is ${-E}; E must be greater than zero`]);
    model.members[0] = { id: "AB", start: "A", end: "B", kind: "truss", E: 0, A };
    expect(errorsOf(model).map((e) => e.message)).toEqual(["members[0].E is 0; E must be greater than zero"]);
  });

  it("zero length is judged against the size of the model: 1e-12 of the largest coordinate, negative ones included", () => {
    // Far from the origin, 1e-7 m is below 1e-12 × 1e6 m = 1e-6 m: the nodes coincide.
    for (const x0 of [1e6, -1e6 - 1e-7]) {
      expect(errorsOf(beam(1e-7, x0))).toEqual([
        { kind: "zero-length-member", member: "AB", message: "Member AB has zero length: nodes A and B coincide" },
      ]);
    }
    const farAbove = beam(1e-7, 0);
    farAbove.nodes.push({ id: "F", x: 0, y: -1e6 });
    expect(errorsOf(farAbove).map((e) => e.kind)).toEqual(["zero-length-member"]);
    // Near the origin the same 1e-7 m is a member; 2e-6 m at 1e6 m is one too.
    accepts(beam(1e-7, 0));
    accepts(beam(2e-6, 1e6));
    // A model whose every coordinate is zero has scale 1 m, not 0: its zero-length member is refused.
    expect(errorsOf(beam(0, 0)).map((e) => e.kind)).toEqual(["zero-length-member"]);
  });

  it("loads on a zero-length member are not checked against its (undefined) length", () => {
    const model = beam(0, 0);
    model.loadCases[0].loads.push(
      { kind: "distributed", member: "AB", direction: "global-y", wStart: -1, from: 3, to: 1 },
      point(5),
    );
    expect(errorsOf(model).map((e) => e.kind)).toEqual(["zero-length-member"]);
  });
});

describe("load positions", () => {
  // L = 4 m; a load may lie up to 1e-9·L beyond either end, for templates that compute L with rounding.
  const L = 4;

  it("a point load up to 1e-9·L beyond an end is on the member; beyond that it is outside, at either end", () => {
    for (const x of [-1e-9 * L, -0.9e-9 * L, 0, L, L * (1 + 0.9e-9), L * (1 + 1e-9)]) {
      const model = beam(L);
      model.loadCases[0].loads.push(point(x), { kind: "couple", member: "AB", position: x, value: 1 });
      accepts(model);
    }
    for (const x of [-1.1e-9 * L, L * (1 + 1.1e-9)]) {
      const model = beam(L);
      model.loadCases[0].loads.push({ kind: "couple", member: "AB", position: x, value: 1 });
      expect(errorsOf(model)).toEqual([
        {
          kind: "load-outside-member",
          path: "loadCases[0].loads[0].position",
          member: "AB",
          message: `loadCases[0].loads[0].position = ${x} m lies outside member AB (length 4 m)`,
        },
      ]);
    }
  });

  it("a partial load names whichever end lies outside, and both when both do", () => {
    const partial = (from?: number, to?: number) => {
      const model = beam(L);
      model.loadCases[0].loads.push({ kind: "distributed", member: "AB", direction: "local-y", wStart: -1, from, to });
      return model;
    };
    expect(errorsOf(partial(-1)).map((e) => e.message)).toEqual([
      "loadCases[0].loads[0].from = -1 m lies outside member AB (length 4 m)",
    ]);
    expect(errorsOf(partial(undefined, 5)).map((e) => e.message)).toEqual([
      "loadCases[0].loads[0].to = 5 m lies outside member AB (length 4 m)",
    ]);
    expect(errorsOf(partial(-1, 5)).map((e) => e.message)).toEqual([
      "loadCases[0].loads[0].from = -1 m lies outside member AB (length 4 m)",
      "loadCases[0].loads[0].to = 5 m lies outside member AB (length 4 m)",
    ]);
    // "from" alone runs to L, "to" alone from 0: each must leave a length between them.
    expect(errorsOf(partial(L)).map((e) => e.message)).toEqual(['loadCases[0].loads[0]: "from" must be less than "to"']);
    expect(errorsOf(partial(undefined, 0)).map((e) => e.message)).toEqual([
      'loadCases[0].loads[0]: "from" must be less than "to"',
    ]);
    expect(errorsOf(partial(2, 2)).map((e) => e.message)).toEqual(['loadCases[0].loads[0]: "from" must be less than "to"']);
    accepts(partial(1));
    accepts(partial(undefined, 1));
    accepts(partial(1, 3));
  });

  it("a projected load is refused in a local direction only; in a global one, with or without a range, it is fine", () => {
    for (const direction of ["global-x", "global-y"]) {
      const model = beam(L);
      model.loadCases[0].loads.push(
        { kind: "distributed", member: "AB", direction, wStart: -1, projected: true },
        { kind: "distributed", member: "AB", direction, wStart: -1, projected: true, from: 1 },
      );
      accepts(model);
    }
    const model = beam(L);
    model.loadCases[0].loads.push({
      kind: "distributed",
      member: "AB",
      direction: "local-x",
      wStart: -1,
      projected: true,
      from: 1,
    });
    expect(errorsOf(model)).toEqual([
      {
        kind: "invalid-load",
        path: "loadCases[0].loads[0].projected",
        message: "loadCases[0].loads[0]: projected intensities need a global direction",
      },
    ]);
  });

  it("loads are numbered within their case; self-weight is never checked against a member", () => {
    const model = beam(L);
    model.loadCases.push({
      id: "W",
      loads: [{ kind: "self-weight" }, { kind: "nodal", node: "B", fx: 1 }, point(9), { kind: "nodal", node: "Z", fy: 1 }],
    });
    expect(errorsOf(model).map((e) => ("path" in e ? e.path : ""))).toEqual([
      "loadCases[1].loads[2].position",
      "loadCases[1].loads[3].node",
    ]);
  });
});

describe("references to load cases and results", () => {
  it("a spring must be stiff, in any direction; a settlement in an existing case, or in every case, is fine", () => {
    const model = beam();
    model.nodes[1].support = {
      ux: { kind: "spring", stiffness: 1e6 },
      uy: { kind: "prescribed", value: -0.01, loadCase: "D" },
      rz: { kind: "spring", stiffness: 0 },
    };
    expect(errorsOf(model)).toEqual([
      {
        kind: "non-positive-property",
        path: "nodes[1].support.rz.stiffness",
        property: "stiffness",
        value: 0,
        message: "nodes[1].support.rz.stiffness is 0; stiffness must be greater than zero",
      },
    ]);
    model.nodes[1].support = { ux: { kind: "spring", stiffness: 1e6 }, uy: { kind: "prescribed", value: -0.01 } };
    accepts(model);
  });

  it("an envelope may include combinations as well as load cases; each unknown one is named with its place", () => {
    const model = beam();
    model.combinations = [{ id: "C", factors: { D: 1.35 } }];
    model.envelopes = [
      { id: "E1", of: ["D", "C"] },
      { id: "E2", of: ["C", "X", "D", "Y"] },
    ];
    expect(errorsOf(model).map((e) => ("path" in e ? e.path : ""))).toEqual(["envelopes[1].of[1]", "envelopes[1].of[3]"]);
  });
});

describe("a valid model", () => {
  it("comes back with its index maps and the end nodes of each member", () => {
    const model = beam();
    model.nodes.push({ id: "C", x: 4, y: 3 });
    model.members.push({ id: "CB", start: "C", end: "B", kind: "truss", E, A });
    const out = validateModel(model);
    if (!out.ok) throw new Error(JSON.stringify(out.errors));
    expect(Array.from(out.memberEnds)).toEqual([0, 1, 2, 1]);
    expect([out.nodeIndex.get("C"), out.memberIndex.get("CB"), out.memberIndex.get("AB")]).toEqual([2, 1, 0]);
  });
});
