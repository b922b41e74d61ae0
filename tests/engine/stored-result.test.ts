/**
 * A calc sheet drawn next year from the database draws the same diagrams: the model JSON and the result JSON
 * (resultToJson) are all restoreResult needs, with nothing kept in the analysing process.
 */
import { describe, it, expect } from "vitest";
import { readFileSync } from "node:fs";
import path from "node:path";
import {
  analyze,
  memberDiagram,
  memberEndForces,
  memberEnvelope,
  nodeDisplacement,
  nodeReaction,
  restoreResult,
  resultToCanonicalJson,
  resultToJson,
  type AnalysisResult,
  type ModelInput,
} from "@/lib/engine";
import { randomRichFrame } from "./random-rich-frames";

const root = path.resolve(import.meta.dirname, "../..");
const example = (name: string) =>
  JSON.parse(readFileSync(path.join(root, "content/engine-examples", name), "utf8")) as ModelInput;
const portal = example("portal-frame.json");

function analyzeOrThrow(model: unknown): AnalysisResult {
  const out = analyze(model);
  if (!out.ok) throw new Error(JSON.stringify(out.errors));
  return out.result;
}

/** What a run stores: two JSON texts. Read back with JSON.parse, they share no object with the analysis. */
function storeAndRestore(model: ModelInput, result: AnalysisResult, points = 0): AnalysisResult {
  const storedModel = JSON.stringify(model);
  const storedResult = JSON.stringify(resultToJson(result, { points }));
  const restored = restoreResult(JSON.parse(storedModel), JSON.parse(storedResult));
  if (!restored.ok) throw new Error(JSON.stringify(restored.errors));
  return restored.result;
}

/** The same numbers: JSON text compares every value exactly (and prints −0 as 0, as storage does). */
function expectSame(actual: unknown, expected: unknown): void {
  expect(JSON.stringify(actual)).toBe(JSON.stringify(expected));
}

function expectSameDiagrams(restored: AnalysisResult, original: AnalysisResult): void {
  // Vectors, checks and sources (the order in which a combination adds up its cases' span loads).
  expectSame(restored.loadCases, original.loadCases);
  expectSame(restored.combinations, original.combinations);
  const ids = [...Object.keys(original.loadCases), ...Object.keys(original.combinations)];
  for (const memberId of original.memberIds) {
    for (const id of ids) {
      const before = memberDiagram(original, memberId, id, { points: 21 });
      const after = memberDiagram(restored, memberId, id, { points: 21 });
      expectSame(after.quantities, before.quantities);
      expectSame(after.extremes, before.extremes);
      expectSame(after.samples, before.samples);
      for (const f of [0, 0.13, 0.5, 0.77, 1]) {
        for (const side of ["left", "right"] as const)
          expectSame(after.valueAt(f * after.length, side), before.valueAt(f * before.length, side));
      }
    }
    for (const envelopeId of Object.keys(original.envelopes))
      expectSame(
        memberEnvelope(restored, memberId, envelopeId, { points: 15 }),
        memberEnvelope(original, memberId, envelopeId, { points: 15 }),
      );
    expectSame(memberEnvelope(restored, memberId, ids, { points: 9 }), memberEnvelope(original, memberId, ids, { points: 9 }));
  }
}

describe("diagrams from the stored model and result alone", () => {
  it("the portal frame: every member, load case, combination and envelope draws identical diagrams and extremes", () => {
    const original = analyzeOrThrow(portal);
    const restored = storeAndRestore(portal, original);
    expect(restored).not.toBe(original);
    expect(restored.loadCases.G.displacements.buffer).not.toBe(original.loadCases.G.displacements.buffer);
    expectSameDiagrams(restored, original);
  });

  it("random frames with releases, truss members, springs, settlements and every load kind", () => {
    for (const seed of [1, 2, 3, 4, 5, 6, 7, 8]) {
      const model = randomRichFrame(seed, { maxStoreys: 3, maxBays: 3 });
      const original = analyzeOrThrow(model);
      expectSameDiagrams(storeAndRestore(model, original), original);
    }
  });

  it("the restored result reads and serialises exactly as the original, from JSON with or without sampled diagrams", () => {
    const original = analyzeOrThrow(portal);
    for (const points of [0, 11]) {
      const restored = storeAndRestore(portal, original, points);
      expect(resultToCanonicalJson(restored, { points: 7 })).toBe(resultToCanonicalJson(original, { points: 7 }));
      expect(JSON.stringify(resultToJson(restored, { points: 7 }))).toBe(JSON.stringify(resultToJson(original, { points: 7 })));
      expectSame(nodeDisplacement(restored, "B", "ULS-1"), nodeDisplacement(original, "B", "ULS-1"));
      expectSame(nodeReaction(restored, "A", "W"), nodeReaction(original, "A", "W"));
      expectSame(memberEndForces(restored, "beam", "SLS"), memberEndForces(original, "beam", "SLS"));
      expectSame(restored.envelopes, original.envelopes);
      expect(Object.isFrozen(restored.loadCases)).toBe(true);
    }
  });

  it("a result stored without diagram extremes (a run's record) restores to the same extremes, diagrams and JSON", () => {
    for (const [model, name] of [
      [portal, "portal"],
      [randomRichFrame(3, { maxStoreys: 3, maxBays: 2 }), "random frame 3"],
    ] as const) {
      const original = analyzeOrThrow(model);
      const stored = resultToCanonicalJson(original, { extremes: false });
      expect(stored, name).not.toContain("diagramExtremes");
      const restored = restoreResult(JSON.parse(JSON.stringify(model)), JSON.parse(stored));
      if (!restored.ok) throw new Error(JSON.stringify(restored.errors));
      expectSameDiagrams(restored.result, original);
      // The full JSON, extremes included, comes back byte for byte from the narrower one.
      expect(resultToCanonicalJson(restored.result), name).toBe(resultToCanonicalJson(original));
      expect(resultToCanonicalJson(restored.result, { extremes: false }), name).toBe(stored);
    }
  });

  it("restores from the canonical text (keys sorted) just as well", () => {
    const model = randomRichFrame(9, { maxStoreys: 2, maxBays: 3 });
    const original = analyzeOrThrow(model);
    const restored = restoreResult(JSON.parse(JSON.stringify(model)), JSON.parse(resultToCanonicalJson(original)));
    if (!restored.ok) throw new Error(JSON.stringify(restored.errors));
    expectSameDiagrams(restored.result, original);
  });

  it("keeps the identity of the engine that made the run, not the current one", () => {
    const original = analyzeOrThrow(portal);
    const stored = { ...(resultToJson(original) as object), engineVersion: "0.0.9", engineSourceHash: "f".repeat(64) };
    const restored = restoreResult(portal, JSON.parse(JSON.stringify(stored)));
    if (!restored.ok) throw new Error(JSON.stringify(restored.errors));
    expect(restored.result.engineVersion).toBe("0.0.9");
    expect(resultToJson(restored.result)).toMatchObject({ engineVersion: "0.0.9", engineSourceHash: "f".repeat(64) });
  });

  it("a stored result that does not fit its model is refused, naming the path", () => {
    const original = analyzeOrThrow(portal);
    const stored = () => JSON.parse(JSON.stringify(resultToJson(original)));
    const errorsOf = (model: unknown, json: unknown) => {
      const out = restoreResult(model, json);
      if (out.ok) throw new Error("expected restoreResult to refuse");
      return out.errors;
    };
    const missing = stored();
    delete missing.loadCases.G.displacements.C;
    expect(errorsOf(portal, missing)).toContainEqual(
      expect.objectContaining({ kind: "invalid-stored-result", path: "loadCases.G.displacements.C" }),
    );
    const factors = stored();
    factors.combinations["ULS-1"].factors.Q = 1.6;
    expect(errorsOf(portal, factors)).toContainEqual(
      expect.objectContaining({ kind: "invalid-stored-result", path: "combinations.ULS-1.factors.Q" }),
    );
    const damaged = stored();
    damaged.loadCases.W.endForces.beam.end.mz = "12";
    expect(errorsOf(portal, damaged)).toContainEqual(expect.objectContaining({ path: "loadCases.W.endForces.beam.end.mz" }));
    const otherModel = { ...portal, members: portal.members!.filter((m) => m.id !== "col-right") };
    expect(errorsOf(otherModel, stored())).toContainEqual(expect.objectContaining({ path: "loadCases.G.endForces.col-right" }));
    expect(errorsOf(portal, null)[0]).toMatchObject({ kind: "invalid-stored-result", path: "result" });
    expect(errorsOf({ nodes: "none" }, stored())[0].kind).toBe("invalid-model");
  });

  it("a parsed result that was not restored is refused by memberDiagram, pointing at restoreResult", () => {
    const parsed = JSON.parse(JSON.stringify(resultToJson(analyzeOrThrow(portal)))) as AnalysisResult;
    expect(() => memberDiagram(parsed, "beam", "G")).toThrow(/restoreResult/);
  });
});
