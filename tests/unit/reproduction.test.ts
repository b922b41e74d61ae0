// A stored run's record compared with its evaluation made again (lib/standards/reproduction.ts): byte for byte by
// output part, the identity on its own, and each output with its relative difference. The starting library's
// simply supported beam is evaluated in-process, as the evaluation bundle's `run` task does it.
import fs from "node:fs";
import path from "node:path";
import { describe, expect, it } from "vitest";
import { runStandardTask } from "@/lib/evaluation/tasks";
import { compareReproduction, type Reevaluation } from "@/lib/standards/reproduction";
import { RUN_RECORD_FORMAT, runFailureOf, type RunRecord } from "@/lib/standards/run-record";
import type { Evaluation } from "@/lib/standards/evaluate";
import { resultToCanonicalJson, restoreResult, type EngineError } from "@/lib/engine";

const source = fs.readFileSync(path.resolve("content/standards/simply-supported-beam/1.mdx"), "utf8");
const typed = { L: "7 m" };
const again = runStandardTask(source, typed);
if (!again.ok || !again.evaluationJson || !again.analysisJson) throw new Error("the starting standard no longer evaluates");
const evaluation = JSON.parse(again.evaluationJson) as Evaluation;

const base = {
  format: RUN_RECORD_FORMAT,
  id: "00000000-0000-4000-8000-000000000001",
  createdAt: "2026-01-05T09:00:00.000Z",
  createdBy: { id: "u1", name: "An engineer" },
  job: { id: "j1", number: "T-1", name: "A job" },
  standard: { slug: "simply-supported-beam", title: "Beam", versionId: "v1", number: 1, contentHash: "0".repeat(64) },
  purpose: "design",
  parentRunId: null,
  unitSystem: "si",
  typed,
  identity: { ...evaluation.identity, bundleSha256: "1".repeat(64) },
  libraries: [],
  order: {
    inputs: Object.keys(evaluation.inputs),
    derived: Object.keys(evaluation.derived),
    extracts: Object.keys(evaluation.extracts),
    checks: Object.keys(evaluation.checks),
  },
} as const;
const stored: RunRecord = { ...base, outcome: "succeeded", evaluation, analysis: JSON.parse(again.analysisJson) };

describe("compareReproduction", () => {
  it("finds the same evaluation identical, part by part and output by output", () => {
    const comparison = compareReproduction(stored, again);
    expect(comparison).toMatchObject({ identical: true, differing: 0, note: null, identity: { same: true } });
    expect(comparison.parts).toEqual([
      { part: "evaluation", identical: true },
      { part: "analysis", identical: true },
    ]);
    const groups = new Set(comparison.outputs.map((o) => o.group));
    expect(groups).toEqual(new Set(["derived", "extract", "utilisation"]));
    expect(comparison.outputs.every((o) => !o.changed && o.relative === 0)).toBe(true);
  });

  it("says when the numbers are the same but another engine made them", () => {
    // The record names another engine in its identity and in the engine's result it holds: the parts are compared
    // without the names, and the identity on its own.
    const analysis = { ...(stored as { analysis: Record<string, unknown> }).analysis, engineSourceHash: "f".repeat(64) };
    const older: RunRecord = { ...stored, identity: { ...stored.identity, engine: "0.0.1" }, analysis } as RunRecord;
    const comparison = compareReproduction(older, again);
    expect(comparison).toMatchObject({ identical: false, differing: 0, identity: { same: false } });
    expect(comparison.parts.every((p) => p.identical)).toBe(true);
    // A number of the engine's result that differs still shows.
    const changed = JSON.parse(JSON.stringify(analysis));
    changed.stats.equations += 1;
    const differs = compareReproduction({ ...older, analysis: changed } as RunRecord, again);
    expect(differs.parts).toContainEqual({ part: "analysis", identical: false });
  });

  it("counts every stored output as differing when the version no longer compiles", () => {
    const failed: Reevaluation = { ok: false, problems: [{ message: "unknown quantity" }] };
    const comparison = compareReproduction(stored, failed);
    expect(comparison.identical).toBe(false);
    expect(comparison.note).toBe("The version did not compile: unknown quantity.");
    expect(comparison.differing).toBe(comparison.outputs.length);
    expect(comparison.outputs.every((o) => o.changed && o.b === null)).toBe(true);
  });

  it("compares a failed run's failure byte for byte", () => {
    const errors: EngineError[] = [
      { kind: "unstable", node: "B", direction: "uy", message: "Node B is free to move in y" } as EngineError,
    ];
    const outcome = { ok: false, stage: "engine", errors } as const;
    const failedRun: RunRecord = { ...base, outcome: "failed", failure: runFailureOf(outcome) };
    const same = compareReproduction(failedRun, { ok: true, outcome, evaluationJson: null, analysisJson: null });
    expect(same).toMatchObject({ identical: true, parts: [{ part: "failure", identical: true }], note: null });
    const other = { ok: false, stage: "engine", errors: [{ ...errors[0], node: "C" }] } as const;
    const differs = compareReproduction(failedRun, { ok: true, outcome: other, evaluationJson: null, analysisJson: null });
    expect(differs).toMatchObject({
      identical: false,
      note: "The run failed when it was made; evaluated again, it fails otherwise.",
    });
    const succeeds = compareReproduction(failedRun, again);
    expect(succeeds).toMatchObject({ identical: false, note: "The run failed when it was made; evaluated again, it succeeds." });
  });

  describe("a gusset-run/1 record, which also holds the diagram extremes", () => {
    // The extremes as the bundle that made such a record wrote them: the full result JSON, drawn from the restored one.
    const restored = restoreResult(evaluation.model, JSON.parse(again.analysisJson!));
    if (!restored.ok) throw new Error(JSON.stringify(restored.errors));
    const fullJson = resultToCanonicalJson(restored.result);
    const older: RunRecord = { ...stored, format: "gusset-run/1", analysis: JSON.parse(fullJson) };

    it("today's bundle, which writes no extremes: the rest is compared byte for byte, and the page says so", () => {
      expect(fullJson).toContain("diagramExtremes");
      expect(again.analysisJson).not.toContain("diagramExtremes");
      const comparison = compareReproduction(older, again);
      expect(comparison).toMatchObject({ identical: true, differing: 0 });
      expect(comparison.note).toMatch(/diagram extremes.*compared without them/);
      // An end force changed in the record is still found.
      const altered = JSON.parse(fullJson);
      const member = Object.keys(altered.loadCases.D.endForces)[0];
      altered.loadCases.D.endForces[member].start.mz += 1;
      const changed = compareReproduction({ ...older, analysis: altered }, again);
      expect(changed.parts).toContainEqual({ part: "analysis", identical: false });
    });

    it("the bundle that made it (as issued), which writes them: every byte is compared, extremes included", () => {
      const asIssued = { ...again, analysisJson: fullJson };
      expect(compareReproduction(older, asIssued)).toMatchObject({ identical: true, note: null });
      const altered = JSON.parse(fullJson);
      const member = Object.keys(altered.loadCases.D.diagramExtremes)[0];
      altered.loadCases.D.diagramExtremes[member].M.max.value += 1;
      const changed = compareReproduction({ ...older, analysis: altered }, asIssued);
      expect(changed).toMatchObject({ identical: false, note: null });
      expect(changed.parts).toContainEqual({ part: "analysis", identical: false });
    });
  });
});
