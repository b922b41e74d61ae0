// A stored run's record text made the quick way (the evaluation's and the engine result's canonical JSON spliced in
// as the bundle wrote them) is byte for byte the text of the whole record canonicalised (RFC 8785), for every starting
// standard that needs no library; the splice never matches anything but its own placeholder, and a number JSON cannot
// hold is refused rather than written as null.
import fs from "node:fs";
import path from "node:path";
import { describe, expect, it } from "vitest";
import { runStandardTask } from "@/lib/evaluation/tasks";
import {
  readRunRecord,
  runRecordText,
  runRecordTextOfParts,
  RUN_RECORD_FORMAT,
  type RunRecord,
} from "@/lib/standards/run-record";
import type { Evaluation } from "@/lib/standards/evaluate";

const folder = path.resolve(import.meta.dirname, "../../content/standards");
// The newest version of each starting standard (content/standards/<slug>/<number>.mdx).
const sources = fs
  .readdirSync(folder)
  .map((slug) => {
    const newest = fs
      .readdirSync(path.join(folder, slug))
      .filter((file) => /^\d+\.mdx$/.test(file))
      .sort((a, b) => Number.parseInt(b, 10) - Number.parseInt(a, 10))[0];
    return { name: slug, source: fs.readFileSync(path.join(folder, slug, newest), "utf8") };
  })
  .filter(({ source }) => !/quantity:\s*(section|material)\s*[,}\n]/.test(source));

function baseOf(name: string) {
  return {
    format: RUN_RECORD_FORMAT,
    id: "0b8e6f7a-4c1d-4f7e-9a51-7d2f0c3e9b10",
    createdAt: "2026-12-02T23:30:00.000Z",
    createdBy: { id: "u1", name: "A. Engineer \u201cquoted\u201d" },
    job: { id: "j1", number: "MF-2291", name: 'Job with \\ backslash and "quotes"' },
    standard: { slug: name, title: name, versionId: "v1", number: 1, contentHash: "0".repeat(64) },
    purpose: "design",
    parentRunId: null,
    unitSystem: "si",
    typed: { L: "6 m" },
    identity: { engine: "e", engineSourceHash: "1".repeat(64), evaluation: "0.2.0", bundleSha256: "2".repeat(64) },
    libraries: [],
    order: { inputs: [], derived: [], extracts: [], checks: [] },
  } as const;
}

/** A standard run at its defaults: its evaluation as the worker hands it over, and both canonical texts. */
function partsOf(name: string, source: string) {
  const result = runStandardTask(source);
  if (!result.ok || !result.outcome.ok || !result.evaluationJson || !result.analysisJson) throw new Error(`${name} did not run`);
  return { evaluation: result.outcome.evaluation, evaluationJson: result.evaluationJson, analysisJson: result.analysisJson };
}

describe("runRecordTextOfParts", () => {
  it("has starting standards to try", () => expect(sources.length).toBeGreaterThan(3));

  it.each(sources.map((s) => [s.name, s.source]))("gives the canonical text of the whole record for %s", (name, source) => {
    const parts = partsOf(name, source);
    const quick = runRecordTextOfParts({ ...baseOf(name), outcome: "succeeded" }, parts);
    const whole = runRecordText({
      ...baseOf(name),
      outcome: "succeeded",
      evaluation: JSON.parse(parts.evaluationJson) as Evaluation,
      analysis: JSON.parse(parts.analysisJson),
    } as RunRecord);
    expect(quick).toBe(whole);
    // The evaluation as an object (what storing reads pass, utilisation and entries from) is the one its text writes.
    expect(runRecordText({ ...baseOf(name), outcome: "succeeded", evaluation: parts.evaluation, analysis: 0 })).toBe(
      runRecordText({ ...baseOf(name), outcome: "succeeded", evaluation: JSON.parse(parts.evaluationJson), analysis: 0 }),
    );
    expect(readRunRecord(quick)).toEqual(JSON.parse(whole));
  });

  it("refuses an evaluation holding a number JSON cannot hold, which its canonical text would have written as null", () => {
    const { name, source } = sources[0];
    const parts = partsOf(name, source);
    const [check] = Object.keys(parts.evaluation.checks);
    const checks = { ...parts.evaluation.checks, [check]: { ...parts.evaluation.checks[check], utilisation: NaN } };
    expect(() =>
      runRecordTextOfParts({ ...baseOf(name), outcome: "succeeded" }, { ...parts, evaluation: { ...parts.evaluation, checks } }),
    ).toThrow("not finite");
  });

  it("splices each part once, leaving no placeholder behind", () => {
    const { name, source } = sources[0];
    const parts = partsOf(name, source);
    const text = runRecordTextOfParts({ ...baseOf(name), outcome: "succeeded" }, parts);
    expect(text).not.toContain("\\u0000");
    expect(text.split(parts.analysisJson)).toHaveLength(2);
    expect(text.split(parts.evaluationJson)).toHaveLength(2);
  });
});

describe("the record's format", () => {
  const [{ name, source }] = sources;
  const result = runStandardTask(source);
  if (!result.ok || !result.evaluationJson || !result.analysisJson) throw new Error(`${name} did not run`);
  const evaluation = JSON.parse(result.evaluationJson) as Evaluation;
  const record = { ...baseOf(name), outcome: "succeeded", evaluation, analysis: JSON.parse(result.analysisJson) } as RunRecord;

  it("new runs are gusset-run/2: the engine's result without diagram extremes (drawn again from the end forces)", () => {
    expect(RUN_RECORD_FORMAT).toBe("gusset-run/2");
    expect(result.analysisJson).toContain('"endForces"');
    expect(result.analysisJson).not.toContain("diagramExtremes");
  });

  it("reads gusset-run/1 and gusset-run/2 records, and refuses any other", () => {
    expect(readRunRecord(runRecordText(record)).format).toBe("gusset-run/2");
    expect(readRunRecord(runRecordText({ ...record, format: "gusset-run/1" })).format).toBe("gusset-run/1");
    const unknown = runRecordText({ ...record, format: "gusset-run/3" as RunRecord["format"] });
    expect(() => readRunRecord(unknown)).toThrow("readRunRecord: not a run record (formats gusset-run/1, gusset-run/2)");
    expect(() => readRunRecord('{"id":"x"}')).toThrow(/not a run record/);
  });
});
