/**
 * Stored runs are reproducible byte for byte: stage timings come back beside the result, never inside it, and
 * the same model gives the same canonical JSON however often it is analysed and in whatever engine state.
 */
import { describe, it, expect, vi } from "vitest";
import { readFileSync } from "node:fs";
import path from "node:path";
import { analyze, canonicalJson, resultToCanonicalJson, resultToJson, type ModelInput } from "@/lib/engine";
import { randomRichFrame } from "./random-rich-frames";

const root = path.resolve(import.meta.dirname, "../..");
const portal = JSON.parse(readFileSync(path.join(root, "content/engine-examples/portal-frame.json"), "utf8")) as ModelInput;
/** Releases, truss diagonals, springs, settlements and every load kind (random-rich-frames.ts). */
const rich = randomRichFrame(11, { maxStoreys: 3, maxBays: 3 });
/** Larger than the others, so analysing it grows the factor workspace the engine reuses between analyses. */
const large = randomRichFrame(5, { maxStoreys: 12, maxBays: 12 });

type Engine = typeof import("@/lib/engine");

function canonicalOf(engine: Pick<Engine, "analyze" | "resultToCanonicalJson">, model: unknown): string {
  const out = engine.analyze(model);
  if (!out.ok) throw new Error(JSON.stringify(out.errors));
  // With sampled diagrams, so the diagrams along members are covered too.
  return engine.resultToCanonicalJson(out.result, { points: 21 });
}

describe("timings beside the result", () => {
  it("analyze returns stage timings beside the result and none inside it", () => {
    const out = analyze(portal);
    if (!out.ok) throw new Error("analysis failed");
    expect(Object.keys(out.timings).sort()).toEqual([
      "assemblyMs",
      "factorMs",
      "orderingMs",
      "recoveryMs",
      "solveMs",
      "symbolicMs",
      "totalMs",
      "validationMs",
    ]);
    for (const ms of Object.values(out.timings)) expect(ms).toBeGreaterThanOrEqual(0);
    expect(out.timings.totalMs).toBeGreaterThanOrEqual(out.timings.validationMs);
    // The result keeps only what the model and the code determine.
    expect(out.result.stats).toEqual({ nodes: 4, members: 3, equations: 6, nnzL: expect.any(Number) });
    expect(JSON.stringify(resultToJson(out.result))).not.toMatch(/Ms"/);
    expect(out.result).not.toHaveProperty("timings");
  });

  it("a failed analysis has errors and no timings", () => {
    const out = analyze({ nodes: [], members: [{ id: "m", start: "a", end: "b", E: 1, A: 1, I: 1 }] });
    expect(out).toEqual({ ok: false, errors: expect.any(Array) });
  });
});

describe("byte-identical canonical results", () => {
  it("the same model analysed twice gives the same bytes, also after a larger model reused the engine's buffers", () => {
    for (const model of [portal, rich]) {
      const first = canonicalOf({ analyze, resultToCanonicalJson }, model);
      canonicalOf({ analyze, resultToCanonicalJson }, large);
      const again = canonicalOf({ analyze, resultToCanonicalJson }, model);
      expect(again).toBe(first);
      // A copy of the model that shares no objects with the first gives the same bytes too.
      expect(canonicalOf({ analyze, resultToCanonicalJson }, JSON.parse(JSON.stringify(model)))).toBe(first);
    }
  });

  it("two fresh engine states (modules loaded anew) give the same bytes as this one", async () => {
    vi.resetModules();
    const fresh1: Engine = await import("@/lib/engine");
    vi.resetModules();
    const fresh2: Engine = await import("@/lib/engine");
    // Really separate module instances: separate factor workspaces and result contexts.
    expect(fresh1.analyze).not.toBe(fresh2.analyze);
    expect(fresh1.analyze).not.toBe(analyze);
    for (const model of [portal, rich, large]) {
      const here = canonicalOf({ analyze, resultToCanonicalJson }, model);
      expect(canonicalOf(fresh1, model)).toBe(here);
      expect(canonicalOf(fresh2, model)).toBe(here);
    }
  });

  it("the canonical text is the result JSON with keys sorted and no white space", () => {
    const out = analyze(portal);
    if (!out.ok) throw new Error("analysis failed");
    const text = resultToCanonicalJson(out.result);
    expect(JSON.parse(text)).toEqual(resultToJson(out.result));
    expect(text).not.toMatch(/\s/);
    expect(text.indexOf('"analysis"')).toBeLessThan(text.indexOf('"combinations"'));
    expect(canonicalJson({ b: [1, { d: -0, c: "x" }], a: null, t: Float64Array.of(0.1, 2) })).toBe(
      '{"a":null,"b":[1,{"c":"x","d":0}],"t":[0.1,2]}',
    );
  });
});
