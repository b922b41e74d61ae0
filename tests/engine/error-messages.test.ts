/**
 * The engine's refusals, word for word: an engineer reads these on the run page, so each names what is
 * wrong, where (the path in the model, the member, the node) and, where it helps, the fix. Each case
 * spoils one thing in a valid two-node beam and expects exactly one error, whole. (common practice)
 */
import { describe, expect, it } from "vitest";
import { analyze } from "@/lib/engine";
import { A, E, I } from "./helpers";

type Model = {
  nodes: { id: string; x: unknown; y: number; support?: Record<string, unknown> }[];
  members: Record<string, unknown>[];
  loadCases: { id: string; loads: unknown[] }[];
  combinations?: unknown[];
  envelopes?: unknown[];
};

function validBeam(): Model {
  return {
    nodes: [
      { id: "A", x: 0, y: 0, support: { ux: "fixed", uy: "fixed", rz: "fixed" } },
      { id: "B", x: 4, y: 0, support: { ux: "free", uy: "fixed", rz: "free" } },
    ],
    members: [{ id: "AB", start: "A", end: "B", E, A, I }],
    loadCases: [{ id: "D", loads: [] }],
  };
}

function errorsAfter(spoil: (model: Model) => void) {
  const model = validBeam();
  spoil(model);
  const out = analyze(model);
  if (out.ok) throw new Error("expected the analysis to refuse the model");
  return out.errors;
}

const CASES: [string, (m: Model) => void, unknown][] = [
  [
    "a number that is not finite",
    (m) => (m.nodes[1].x = Infinity),
    { kind: "non-finite", path: "nodes[1].x", message: "nodes[1].x is Infinity; every number must be finite" },
  ],
  [
    "two nodes with one id",
    (m) => m.nodes.push({ id: "A", x: 9, y: 0 }),
    { kind: "duplicate-id", entity: "node", id: "A", message: 'Two nodes share the id "A"' },
  ],
  [
    "a combination named like a load case",
    (m) => (m.combinations = [{ id: "D", factors: { D: 1 } }]),
    { kind: "duplicate-id", entity: "combination", id: "D", message: 'Combination "D" has the same id as a load case' },
  ],
  [
    "a negative modulus",
    (m) => (m.members[0].E = -1),
    {
      kind: "non-positive-property",
      path: "members[0].E",
      property: "E",
      value: -1,
      message: "members[0].E is -1; E must be greater than zero",
    },
  ],
  [
    "a member ending at a node that does not exist",
    (m) => (m.members[0].end = "Z"),
    { kind: "unknown-node", path: "members[0].end", node: "Z", message: 'Member AB refers to node "Z", which does not exist' },
  ],
  [
    "a member of zero length",
    (m) => (m.nodes[1].x = 0),
    { kind: "zero-length-member", member: "AB", message: "Member AB has zero length: nodes A and B coincide" },
  ],
  [
    "a frame member without I",
    (m) => delete m.members[0].I,
    { kind: "missing-property", member: "AB", property: "I", message: "Frame member AB needs I (second moment of area)" },
  ],
  [
    "a point load beyond the member's end",
    (m) => m.loadCases[0].loads.push({ kind: "point", member: "AB", direction: "global-y", value: -1, position: 5 }),
    {
      kind: "load-outside-member",
      path: "loadCases[0].loads[0].position",
      member: "AB",
      message: "loadCases[0].loads[0].position = 5 m lies outside member AB (length 4 m)",
    },
  ],
  [
    "a partial load whose start is past its end",
    (m) =>
      m.loadCases[0].loads.push({
        kind: "distributed",
        member: "AB",
        direction: "global-y",
        wStart: -1,
        wEnd: -1,
        from: 3,
        to: 1,
      }),
    { kind: "invalid-load", path: "loadCases[0].loads[0]", message: 'loadCases[0].loads[0]: "from" must be less than "to"' },
  ],
  [
    "a projected load in a local direction",
    (m) =>
      m.loadCases[0].loads.push({
        kind: "distributed",
        member: "AB",
        direction: "local-y",
        wStart: -1,
        wEnd: -1,
        projected: true,
      }),
    {
      kind: "invalid-load",
      path: "loadCases[0].loads[0].projected",
      message: "loadCases[0].loads[0]: projected intensities need a global direction",
    },
  ],
  [
    "a nodal load on a node that does not exist",
    (m) => m.loadCases[0].loads.push({ kind: "nodal", node: "Q", fy: 1 }),
    {
      kind: "unknown-node",
      path: "loadCases[0].loads[0].node",
      node: "Q",
      message: 'A load in case D acts on node "Q", which does not exist',
    },
  ],
  [
    "a member load on a member that does not exist",
    (m) => m.loadCases[0].loads.push({ kind: "point", member: "QQ", direction: "global-y", value: -1, position: 1 }),
    {
      kind: "unknown-member",
      path: "loadCases[0].loads[0].member",
      member: "QQ",
      message: 'A load in case D acts on member "QQ", which does not exist',
    },
  ],
  [
    "a settlement in a load case that does not exist",
    (m) => (m.nodes[1].support!.uy = { kind: "prescribed", value: -0.01, loadCase: "S" }),
    {
      kind: "unknown-load-case",
      path: "nodes[1].support.uy.loadCase",
      loadCase: "S",
      message: 'Node B settles in load case "S", which does not exist',
    },
  ],
  [
    "a combination of a load case that does not exist",
    (m) => (m.combinations = [{ id: "C1", factors: { X: 1.2 } }]),
    {
      kind: "unknown-load-case",
      path: "combinations[0].factors.X",
      loadCase: "X",
      message: 'Combination C1 uses load case "X", which does not exist',
    },
  ],
  [
    "a coordinate that is not a number",
    (m) => (m.nodes[0].x = "zero"),
    { kind: "invalid-model", path: "nodes[0].x", message: "nodes[0].x: Invalid input: expected number, received string" },
  ],
];

describe("refusals name what is wrong, where", () => {
  it.each(CASES)("%s", (_name, spoil, expected) => {
    expect(errorsAfter(spoil)).toEqual([expected]);
  });

  it("the valid beam itself is accepted", () => {
    expect(analyze(validBeam()).ok).toBe(true);
  });

  it("an envelope of a result that does not exist", () => {
    const errors = errorsAfter((m) => (m.envelopes = [{ id: "ENV", of: ["nope"] }]));
    expect(errors).toEqual([
      {
        kind: "unknown-result",
        path: "envelopes[0].of[0]",
        id: "nope",
        message: 'Envelope ENV includes "nope", which is neither a load case nor a combination',
      },
    ]);
  });

  it("a node nothing holds in rotation is named with the words an engineer uses", () => {
    // A truss member carries no moment, so a couple on its free end B has nothing to turn against.
    const errors = errorsAfter((m) => {
      m.members[0].kind = "truss";
      m.loadCases[0].loads.push({ kind: "nodal", node: "B", mz: 1 });
    });
    expect(errors).toEqual([
      { kind: "unstable", node: "B", direction: "rz", message: "Node B is free to rotate (mechanism or missing support)" },
    ]);
  });

  it("a part free to move is named by node and direction", () => {
    // B hangs between two collinear truss members: nothing holds it in y, though the supports hold the whole.
    const errors = errorsAfter((m) => {
      m.nodes[1] = { id: "B", x: 4, y: 0 };
      m.nodes.push({ id: "C", x: 8, y: 0, support: { uy: "fixed" } });
      m.members = [
        { id: "AB", start: "A", end: "B", kind: "truss", E, A },
        { id: "BC", start: "B", end: "C", kind: "truss", E, A },
      ];
    });
    expect(errors).toEqual([
      { kind: "unstable", node: "B", direction: "uy", message: "Node B is free to move in y (mechanism or missing support)" },
    ]);
  });

  it("a structure the supports let slide is said to slide, not pinned on one node", () => {
    const errors = errorsAfter((m) => {
      m.nodes[0].support = { uy: "fixed" };
      m.nodes[1].support = { uy: "fixed" };
    });
    expect(errors).toEqual([
      { kind: "rigid-body", motion: "slide-x", message: "The structure can slide in x as a whole: no support restrains x" },
    ]);
  });

  it("a structure whose reactions all pass through one point is said to turn about it", () => {
    // A pinned base and a free tip: the whole member swings about A.
    const errors = errorsAfter((m) => {
      m.nodes[0].support = { ux: "fixed", uy: "fixed", rz: "free" };
      m.nodes[1].support = { ux: "free", uy: "free", rz: "free" };
    });
    expect(errors).toEqual([
      {
        kind: "rigid-body",
        motion: "turn",
        about: { x: 0, y: 0 },
        node: "A",
        message:
          "The structure can turn as a whole about node A (x = 0 m, y = 0 m): every support reaction acts through that point and nothing holds the structure in rotation",
      },
    ]);
  });

  it("a key the model does not know is named with the keys it would accept", () => {
    const errors = errorsAfter((m) => m.loadCases[0].loads.push({ kind: "nodal", node: "B", Fy: -1 }));
    expect(errors).toEqual([
      {
        kind: "invalid-model",
        path: "loadCases[0].loads[0]",
        message: 'loadCases[0].loads[0]: unknown key "Fy"; the valid keys here are kind, node, fx, fy, mz',
      },
    ]);
  });
});
