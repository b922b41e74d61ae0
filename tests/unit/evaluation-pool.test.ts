/**
 * The evaluation pool (lib/evaluation/pool.ts) running the real evaluation bundle. The file builds the bundle
 * itself into a temporary folder, with the very function `npm run build:evaluation` runs (about a second), so
 * it needs no database, server or earlier build and lives with the unit tests; what it compares against is
 * lib/standards run in this process.
 *
 * The runaway and the out-of-memory standard are real sources that compile: the starting multi-storey frame
 * with its count bounds raised, evaluated near the repetition limits (at most 5000 entries per list).
 */
import { afterAll, beforeAll, describe, expect, it, vi } from "vitest";
import fs from "node:fs";
import os from "node:os";
import path from "node:path";
import { Worker } from "node:worker_threads";
import canonicalize from "canonicalize";
import { compileStandard, evaluationToCanonicalJson } from "@/lib/standards";
import { runVerification } from "@/lib/standards/verify";
import { compileTask } from "@/lib/evaluation/tasks";
import { createEvaluationPool, EvaluationBundleMissingError, type EvaluationPool, type PoolOutcome } from "@/lib/evaluation/pool";
import type { EvaluateResult } from "@/lib/evaluation/protocol";
import { buildEvaluationBundle } from "@/scripts/build-evaluation-bundle.mjs";
import { startingStandardFiles } from "@/scripts/lib/starting-standards";

const LONG = 180_000; // a loaded 2-core machine runs these several times slower than an idle one

const standards = startingStandardFiles();
const sourceOf = (file: string) => standards.find((s) => s.file === file)!.source;
const beam = sourceOf("simply-supported-beam/2.mdx");
const frame = sourceOf("multi-storey-frame/1.mdx").replace(/max: 12 \}/g, "max: 1000 }");
/** 49 bays × 49 storeys: 2500 nodes and 4851 members, just inside the 5000 entries a list may make. */
const AT_THE_LIMITS = { n_bays: 49, n_storeys: 49 };
/** The same frame under 40 more combinations, each member checked at every section under each: minutes of work. */
const runaway = frame.replace(
  "  combinations:\n",
  '  combinations:\n    - { id: "X{k}", name: "extra", each: { k: "1 .. 40" }, factors: { D: "1 + k / 100", L: 1.6 } }\n',
);

let outDir: string;
const pools: EvaluationPool[] = [];
function pool(options: Parameters<typeof createEvaluationPool>[0] = {}): EvaluationPool {
  const created = createEvaluationPool({ bundleDir: outDir, ...options });
  pools.push(created);
  return created;
}

function inProcessCanonical(source: string, inputs: Record<string, string | number> = {}): string {
  const compiled = compileStandard(source);
  if (!compiled.ok) throw new Error(JSON.stringify(compiled.problems));
  const outcome = compiled.standard.evaluate(inputs);
  if (!outcome.ok) throw new Error(JSON.stringify(outcome));
  return evaluationToCanonicalJson(outcome.evaluation);
}

/** The canonical JSON the worker made, after checking that the structured clone carried the evaluation unchanged. */
function canonicalFrom(outcome: PoolOutcome<EvaluateResult>): string {
  if (!outcome.ok) throw new Error(`${outcome.reason}: ${outcome.message}`);
  if (!outcome.result.ok || !outcome.result.outcome.ok) throw new Error(JSON.stringify(outcome.result));
  expect(canonicalize(outcome.result.outcome.evaluation)).toBe(outcome.result.canonicalJson);
  return outcome.result.canonicalJson!;
}

beforeAll(async () => {
  outDir = fs.mkdtempSync(path.join(os.tmpdir(), "gusset-evaluation-"));
  await buildEvaluationBundle({ outDir });
}, LONG);

afterAll(async () => {
  await Promise.all(pools.map((p) => p.close()));
  fs.rmSync(outDir, { recursive: true, force: true });
});

describe("the evaluation bundle", () => {
  it(
    "is deterministic: a second build gives the same bytes, named by their sha256",
    async () => {
      const again = fs.mkdtempSync(path.join(os.tmpdir(), "gusset-evaluation-"));
      try {
        const second = await buildEvaluationBundle({ outDir: again });
        const first = JSON.parse(fs.readFileSync(path.join(outDir, "manifest.json"), "utf8"));
        expect(second).toEqual(first);
        expect(fs.readFileSync(path.join(again, second.file)).equals(fs.readFileSync(path.join(outDir, first.file)))).toBe(true);
        expect(second.file).toBe(`evaluation-${second.sha256.slice(0, 16)}.js`);
      } finally {
        fs.rmSync(again, { recursive: true, force: true });
      }
    },
    LONG,
  );

  it("imports no Node builtin statically, so a browser Worker can load it; Node's worker port only dynamically", () => {
    const { file } = JSON.parse(fs.readFileSync(path.join(outDir, "manifest.json"), "utf8"));
    const code = fs.readFileSync(path.join(outDir, file), "utf8");
    expect(code).not.toMatch(/from\s*["']node:/);
    expect(code).not.toMatch(/\brequire\(["']/);
    expect(code).toContain('import("node:worker_threads")');
  });

  it(
    "answers the test hooks only in a worker started for tests",
    async () => {
      const { file } = JSON.parse(fs.readFileSync(path.join(outDir, "manifest.json"), "utf8"));
      const worker = new Worker(path.join(outDir, file));
      try {
        const answer = await new Promise((resolve) => {
          worker.on("message", (m) =>
            m === "evaluation-worker-ready" ? worker.postMessage({ id: 1, task: "test-exit" }) : resolve(m),
          );
        });
        expect(answer).toEqual({ id: 1, ok: false, error: 'unknown task "test-exit"' });
      } finally {
        await worker.terminate();
      }
      expect(() => pool().runTestHook("test-exit")).toThrow(/tests only/);
    },
    LONG,
  );

  it("is looked up through its manifest, with a clear error when it was not built", async () => {
    const empty = fs.mkdtempSync(path.join(os.tmpdir(), "gusset-evaluation-"));
    try {
      const unbuilt = pool({ bundleDir: empty });
      await expect(unbuilt.compile(beam)).rejects.toThrow(EvaluationBundleMissingError);
      await expect(unbuilt.compile(beam)).rejects.toThrow(/npm run build:evaluation/);
    } finally {
      fs.rmSync(empty, { recursive: true, force: true });
    }
  });
});

describe("the evaluation pool", () => {
  it(
    "gives byte-identical results to in-process evaluation for every starting standard, its defaults and its verification cases",
    async () => {
      const shared = pool({ timeoutMs: 60_000 });
      for (const { file, source } of standards) {
        const compiled = compileStandard(source);
        if (!compiled.ok) throw new Error(file);
        const summary = await shared.compile(source);
        expect(summary, file).toEqual({ ok: true, result: compileTask(source) });
        const inputsList = [{}, ...compiled.standard.definition.verification.map((c) => c.inputs)];
        for (const inputs of inputsList)
          expect(canonicalFrom(await shared.evaluate(source, inputs)), `${file} ${JSON.stringify(inputs)}`).toBe(
            inProcessCanonical(source, inputs),
          );
        const verified = await shared.verify(source);
        expect(verified, file).toEqual({ ok: true, result: { ok: true, results: runVerification(compiled.standard) } });
      }
    },
    LONG,
  );

  it(
    "names its worker threads gusset-eval, as the operating system lists them (what bench:runs tells them by)",
    async () => {
      const threadNames = () =>
        fs.readdirSync("/proc/self/task").map((tid) => {
          try {
            return fs.readFileSync(`/proc/self/task/${tid}/comm`, "utf8").trim();
          } catch {
            return "";
          }
        });
      const before = threadNames().filter((name) => name === "gusset-eval").length;
      const answer = await pool({ size: 1, timeoutMs: 60_000 }).evaluate(beam);
      expect(answer.ok).toBe(true);
      // At least: a pool of an earlier test may start a worker meanwhile.
      expect(threadNames().filter((name) => name === "gusset-eval").length).toBeGreaterThanOrEqual(before + 1);
    },
    LONG,
  );

  it(
    "answers a source that does not compile with the same problems as in-process",
    async () => {
      const broken = beam.replace("default: 6 m", "default: 6 kN");
      const expected = compileStandard(broken);
      expect(expected.ok).toBe(false);
      const problems = expected.ok ? [] : expected.problems;
      const answer = await pool({ timeoutMs: 60_000 }).evaluate(broken);
      expect(answer).toEqual({ ok: true, result: { ok: false, problems } });
    },
    LONG,
  );

  it(
    "queues concurrent tasks while every worker is busy, answers each with its own result, and refuses beyond the queue",
    async () => {
      const twoWorkers = pool({ size: 2, maxQueue: 3, timeoutMs: 60_000 });
      const spans = ["4 m", "5 m", "6 m", "7 m", "8 m", "9 m"];
      const answers = spans.map((L) => twoWorkers.evaluate(beam, { L }));
      expect(twoWorkers.stats()).toMatchObject({ workers: 2, busy: 2, queued: 3 });
      const settled = await Promise.all(answers);
      expect(settled[5]).toMatchObject({ ok: false, reason: "busy" });
      expect(settled[5].ok || settled[5].message).toMatch(/too many standards at once/);
      for (const [k, L] of spans.slice(0, 5).entries())
        expect(canonicalFrom(settled[k]), L).toBe(inProcessCanonical(beam, { L }));
      expect(twoWorkers.stats()).toMatchObject({ workers: 2, busy: 0, queued: 0, workersStarted: 2, workersEnded: 0 });
    },
    LONG,
  );

  it(
    "stops a runaway standard at the timeout, terminates its worker and then serves the next task correctly",
    async () => {
      const limited = pool({ size: 1, timeoutMs: 5_000, maxOldGenerationSizeMb: 2048 });
      expect(await limited.compile(runaway)).toMatchObject({ ok: true, result: { ok: true } });
      const started = performance.now();
      const stopped = await limited.evaluate(runaway, AT_THE_LIMITS);
      expect(stopped).toEqual({
        ok: false,
        reason: "timeout",
        message: expect.stringMatching(
          /^This standard took longer than 5 s to evaluate, so it was stopped\. Reduce its repetition/,
        ),
      });
      expect(performance.now() - started).toBeGreaterThanOrEqual(5_000); // not stopped early
      expect(limited.stats()).toMatchObject({ workers: 0, workersEnded: 1 });
      expect(canonicalFrom(await limited.evaluate(beam, { L: "7 m" }))).toBe(inProcessCanonical(beam, { L: "7 m" }));
      expect(limited.stats()).toMatchObject({ workers: 1, workersStarted: 2 });
      await vi.waitFor(() => expect(limited.stats().lastKillMs).not.toBeNull(), { timeout: 30_000 }); // the runaway's thread exited
    },
    LONG,
  );

  it(
    "stops a standard that needs more memory than its worker may use, and then serves the next task correctly",
    async () => {
      const small = pool({ size: 1, timeoutMs: 120_000, maxOldGenerationSizeMb: 48 });
      const stopped = await small.evaluate(frame, AT_THE_LIMITS);
      expect(stopped).toEqual({
        ok: false,
        reason: "out-of-memory",
        message: expect.stringMatching(/^This standard needed more than 48 MB of memory to evaluate, so it was stopped\./),
      });
      expect(canonicalFrom(await small.evaluate(beam))).toBe(inProcessCanonical(beam));
      expect(small.stats()).toMatchObject({ workersStarted: 2, workersEnded: 1 });
    },
    LONG,
  );

  it(
    "answers crashed when a worker thread ends under a task, and replaces it",
    async () => {
      const hooked = pool({ size: 1, timeoutMs: 60_000, testHooks: true });
      expect(await hooked.runTestHook("test-exit")).toEqual({
        ok: false,
        reason: "crashed",
        message: expect.stringMatching(
          /^The evaluation stopped unexpectedly \(the evaluation worker exited with code 3\)\. Try again/,
        ),
      });
      expect(canonicalFrom(await hooked.evaluate(beam))).toBe(inProcessCanonical(beam));
    },
    LONG,
  );
});
