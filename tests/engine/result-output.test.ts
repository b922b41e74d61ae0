/**
 * The output side of a result: reading values by id (lib/engine/access.ts), the JSON a run stores and the CLI
 * prints (resultToJson), and the canonical text that is hashed (canonicalJson). Mistakes here would pass
 * every mechanics test and still put a wrong or unreproducible number on a calc sheet.
 */
import { describe, expect, it } from "vitest";
import {
  analyze,
  canonicalJson,
  memberEndForces,
  nodeDisplacement,
  nodeReaction,
  resultFor,
  resultToJson,
  type ModelInput,
} from "@/lib/engine";
import { analyzeOrThrow, slenderChain } from "./helpers";

/** A 4 m cantilever, fixed at a; case D pulls its tip down by 10 kN, case Z loads nothing. */
function cantilever(): ModelInput {
  return {
    nodes: [
      { id: "a", x: 0, y: 0, support: { ux: "fixed", uy: "fixed", rz: "fixed" } },
      { id: "b", x: 4, y: 0 },
    ],
    members: [{ id: "m", start: "a", end: "b", E: 200e9, A: 5e-3, I: 8e-5 }],
    loadCases: [
      { id: "D", loads: [{ kind: "nodal", node: "b", fy: -10e3 }] },
      { id: "Z", loads: [] },
    ],
  };
}

describe("reading a result by id", () => {
  // Analysed inside each test (not in the describe body), so mutation testing's per-test coverage sees which
  // test reaches which line of the engine.
  const result = () => analyzeOrThrow(cantilever());

  it("reads reactions, displacements and end forces of the ids asked for", () => {
    const r = result();
    // Cantilever, tip load: R = P, M = PL; tip deflection PL³/3EI (AWC Design Aid No. 6, 2005, Fig. 13).
    expect(nodeReaction(r, "a", "D")).toEqual({ fx: 0, fy: expect.closeTo(10e3, 6), mz: expect.closeTo(40e3, 6) });
    expect(nodeDisplacement(r, "b", "D").uy).toBeCloseTo((-10e3 * 4 ** 3) / (3 * 200e9 * 8e-5), 12);
    expect(memberEndForces(r, "m", "D").start.mz).toBeCloseTo(40e3, 6);
  });

  it("an unknown id is a programming error that says what was not found", () => {
    const r = result();
    expect(() => resultFor(r, "W")).toThrow('resultFor: no load case or combination "W"');
    expect(() => nodeDisplacement(r, "c", "D")).toThrow('no node "c"');
    expect(() => nodeReaction(r, "c", "D")).toThrow('no node "c"');
    expect(() => memberEndForces(r, "n", "D")).toThrow('no member "n"');
  });
});

describe("the result as JSON", () => {
  it("reports the reactions of a support in every case, including a case where they are all zero", () => {
    const json = resultToJson(analyzeOrThrow(cantilever())) as { loadCases: Record<string, { reactions: object }> };
    expect(Object.keys(json.loadCases.D.reactions)).toEqual(["a"]);
    expect(json.loadCases.Z.reactions).toEqual({ a: { fx: 0, fy: 0, mz: 0 } });
  });

  it("carries sampled diagrams under `diagrams` when points are asked for, extremes only otherwise", () => {
    const result = analyzeOrThrow(cantilever());
    const sampled = resultToJson(result, { points: 3 }) as { loadCases: { D: Record<string, unknown> } };
    const plain = resultToJson(result) as { loadCases: { D: Record<string, unknown> } };
    expect(sampled.loadCases.D).toHaveProperty("diagrams.m.samples");
    expect(sampled.loadCases.D).not.toHaveProperty("diagramExtremes");
    expect(plain.loadCases.D).toHaveProperty("diagramExtremes.m");
    expect(plain.loadCases.D).not.toHaveProperty("diagrams");
  });

  it("leaves the diagram extremes out of every case and envelope when asked (extremes: false), and nothing else", () => {
    const result = analyzeOrThrow({
      ...cantilever(),
      combinations: [{ id: "U", factors: { D: 1.35 } }],
      envelopes: [{ id: "E", of: ["D", "U"] }],
    });
    const full = resultToJson(result) as Record<string, Record<string, Record<string, Record<string, unknown>>>>;
    const narrow = resultToJson(result, { extremes: false }) as typeof full;
    for (const [group, id] of [
      ["loadCases", "D"],
      ["combinations", "U"],
      ["envelopes", "E"],
    ]) {
      expect(full[group][id]).toHaveProperty("diagramExtremes.m");
      expect(narrow[group][id]).not.toHaveProperty("diagramExtremes");
      const { diagramExtremes: _extremes, ...rest } = full[group][id];
      expect(narrow[group][id]).toEqual(rest);
    }
    // Sampled diagrams are asked for explicitly, so points win over extremes: false.
    expect(resultToJson(result, { points: 3, extremes: false })).toHaveProperty("loadCases.D.diagrams.m.samples");
  });

  it("carries the analysis warnings", () => {
    const out = analyze(slenderChain(1e3));
    if (!out.ok) throw new Error("the model should analyse");
    expect(out.result.warnings).toHaveLength(1);
    expect((resultToJson(out.result) as { warnings: unknown }).warnings).toEqual(out.result.warnings);
  });
});

describe("canonical JSON", () => {
  it("sorts keys whatever order they were written in", () => {
    expect(canonicalJson({ e: 5, d: 4, c: 3, b: 2, a: 1 })).toBe('{"a":1,"b":2,"c":3,"d":4,"e":5}');
    expect(canonicalJson({ b: 1, a: 2, B: 3, A: 4, ä: 5 })).toBe('{"A":4,"B":3,"a":2,"b":1,"ä":5}');
  });

  it("leaves out keys whose value is undefined and writes undefined in an array as null, as JSON.stringify does", () => {
    const value = { a: undefined, b: [1, undefined, 3] };
    expect(canonicalJson(value)).toBe('{"b":[1,null,3]}');
    expect(canonicalJson(value)).toBe(JSON.stringify(value));
  });

  it("refuses a value with no JSON form instead of writing it", () => {
    expect(() => canonicalJson(undefined)).toThrow("canonicalJson: undefined has no JSON form");
    expect(() => canonicalJson(() => 1)).toThrow("canonicalJson: function has no JSON form");
  });
});
