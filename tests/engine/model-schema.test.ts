/**
 * The JSON model format (lib/engine/model.ts): the defaults a model may omit, the shapes it refuses, and the JSON
 * Schema exported for other languages, which describes the input (fields with defaults are optional there).
 * The format is the engine's own (lib/engine/README.md); nothing here comes from a standard.
 */
import { describe, expect, it } from "vitest";
import { ModelSchema, modelJsonSchema } from "@/lib/engine";

type Schema = {
  required?: string[];
  properties: Record<string, Schema & Record<string, unknown>>;
  items: Schema;
  additionalProperties?: boolean;
  default?: unknown;
};

describe("the model format", () => {
  it("fills in every default a model may leave out", () => {
    const parsed = ModelSchema.parse({
      nodes: [{ id: "a", x: 0, y: 0, support: {} }],
      members: [{ id: "m", start: "a", end: "b", E: 1, A: 1, releases: {} }],
      loadCases: [
        {
          id: "L",
          loads: [
            { kind: "nodal", node: "a" },
            { kind: "self-weight" },
            { kind: "distributed", member: "m", direction: "global-y", wStart: 1 },
          ],
        },
        { id: "E" },
      ],
    });
    expect(parsed).toEqual({
      schemaVersion: 1,
      dimension: "2d",
      analysis: { kind: "linear" },
      nodes: [{ id: "a", x: 0, y: 0, support: { ux: "free", uy: "free", rz: "free" } }],
      members: [{ id: "m", start: "a", end: "b", kind: "frame", E: 1, A: 1, releases: { startMoment: false, endMoment: false } }],
      loadCases: [
        {
          id: "L",
          loads: [
            { kind: "nodal", node: "a", fx: 0, fy: 0, mz: 0 },
            { kind: "self-weight", factor: 1 },
            { kind: "distributed", member: "m", direction: "global-y", wStart: 1, projected: false },
          ],
        },
        { id: "E", loads: [] },
      ],
      combinations: [],
      envelopes: [],
    });
    expect(ModelSchema.parse({ nodes: [] })).toEqual({
      schemaVersion: 1,
      dimension: "2d",
      analysis: { kind: "linear" },
      nodes: [],
      members: [],
      loadCases: [],
      combinations: [],
      envelopes: [],
    });
  });

  it("keeps what a model does give: springs, settlements, releases, every load kind and direction", () => {
    const model = {
      schemaVersion: 1,
      dimension: "2d",
      analysis: { kind: "linear" },
      nodes: [
        { id: "a", x: 0, y: 0, support: { ux: "fixed", uy: { kind: "spring", stiffness: 5 }, rz: "free" } },
        { id: "b", x: 1, y: 0, support: { ux: "free", uy: { kind: "prescribed", value: -0.01, loadCase: "L" }, rz: "fixed" } },
      ],
      members: [
        { id: "m", start: "a", end: "b", kind: "truss", E: 1, A: 1, I: 2, cTop: 0.1, cBottom: 0.2, density: 3 },
        { id: "n", start: "b", end: "a", kind: "frame", E: 1, A: 1, I: 2, releases: { startMoment: true, endMoment: true } },
      ],
      loadCases: [
        {
          id: "L",
          name: "Load",
          loads: [
            { kind: "nodal", node: "a", fx: 1, fy: 2, mz: 3 },
            { kind: "self-weight", factor: 1.35 },
            { kind: "distributed", member: "m", direction: "local-x", wStart: 1, wEnd: 2, from: 0.1, to: 0.9, projected: false },
            { kind: "distributed", member: "m", direction: "global-x", wStart: 1, projected: true },
            { kind: "point", member: "n", direction: "local-y", position: 0.5, value: -4 },
            { kind: "point", member: "n", direction: "global-y", position: 0.5, value: -4 },
            { kind: "couple", member: "n", position: 0.25, value: 7 },
          ],
        },
      ],
      combinations: [{ id: "C", name: "Comb", factors: { L: 1.5 } }],
      envelopes: [{ id: "E", name: "Env", of: ["L", "C"] }],
    };
    expect(ModelSchema.parse(model)).toEqual(model);
  });

  it.each([
    ["an empty id", { nodes: [{ id: "", x: 0, y: 0 }] }],
    ["an empty node reference", { nodes: [{ id: "a", x: 0, y: 0 }], members: [{ id: "m", start: "", end: "a", E: 1, A: 1 }] }],
    ["an envelope of nothing", { nodes: [], envelopes: [{ id: "E", of: [] }] }],
    ["another schema version", { schemaVersion: 2, nodes: [] }],
    ["three dimensions", { dimension: "3d", nodes: [] }],
    ["another analysis", { analysis: { kind: "p-delta" }, nodes: [] }],
    ["a restraint by another name", { nodes: [{ id: "a", x: 0, y: 0, support: { ux: "pinned" } }] }],
    ["a spring without stiffness", { nodes: [{ id: "a", x: 0, y: 0, support: { ux: { kind: "spring" } } }] }],
    [
      "a settlement in an unnamed case",
      { nodes: [{ id: "a", x: 0, y: 0, support: { uy: { kind: "prescribed", value: 1, loadCase: "" } } }] },
    ],
    ["a member of another kind", { nodes: [], members: [{ id: "m", start: "a", end: "b", kind: "beam", E: 1, A: 1 }] }],
    [
      "a load in another direction",
      { nodes: [], loadCases: [{ id: "L", loads: [{ kind: "point", member: "m", direction: "down", position: 0, value: 1 }] }] },
    ],
    ["a load of another kind", { nodes: [], loadCases: [{ id: "L", loads: [{ kind: "pressure", member: "m" }] }] }],
    [
      "an unknown key on a release",
      { nodes: [], members: [{ id: "m", start: "a", end: "b", E: 1, A: 1, releases: { start: true } }] },
    ],
    ["an unknown key on a support", { nodes: [{ id: "a", x: 0, y: 0, support: { uz: "fixed" } }] }],
    ["an unknown key on the model", { nodes: [], units: "SI" }],
    ["a combination factor that is not a number", { nodes: [], combinations: [{ id: "C", factors: { L: "1.5" } }] }],
  ])("refuses %s", (_name, input) => {
    expect(ModelSchema.safeParse(input).success).toBe(false);
  });
});

describe("the JSON Schema of the model format", () => {
  const schema = modelJsonSchema() as unknown as Schema;
  const member = schema.properties.members.items;
  const support = schema.properties.nodes.items.properties.support;

  it("describes the input: only what has no default is required", () => {
    expect(schema.required).toEqual(["nodes"]);
    expect(Object.keys(schema.properties)).toEqual([
      "schemaVersion",
      "dimension",
      "analysis",
      "nodes",
      "members",
      "loadCases",
      "combinations",
      "envelopes",
    ]);
    expect(schema.properties.nodes.items.required).toEqual(["id", "x", "y"]);
    expect(member.required).toEqual(["id", "start", "end", "E", "A"]);
    expect(support.required ?? []).toEqual([]);
  });

  it("gives the defaults and refuses unknown keys", () => {
    expect(schema.additionalProperties).toBe(false);
    expect(member.additionalProperties).toBe(false);
    expect(schema.properties.schemaVersion.default).toBe(1);
    expect(schema.properties.dimension.default).toBe("2d");
    expect(schema.properties.analysis.default).toEqual({ kind: "linear" });
    expect(member.properties.kind).toMatchObject({ default: "frame", enum: ["frame", "truss"] });
    expect(member.properties.releases.properties.startMoment.default).toBe(false);
    for (const dof of ["ux", "uy", "rz"]) expect(support.properties[dof].default).toBe("free");
  });
});
