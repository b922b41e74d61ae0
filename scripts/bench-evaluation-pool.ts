/**
 * npm run bench:evaluation-pool — what running standards in worker threads (lib/evaluation/pool.ts) costs: the
 * bundle's size, a worker's cold start (new Worker → bundle loaded), the first answer of a cold pool, the round
 * trip per task for the simple beam against the same work in-process, and how fast a runaway is stopped. Builds
 * the bundle from the current sources into a temporary folder first. Run under `--conditions react-server`
 * (the npm script does) because the pool imports `server-only`.
 */
import fs from "node:fs";
import { cpus, loadavg, tmpdir } from "node:os";
import path from "node:path";
import { Worker } from "node:worker_threads";
import { createEvaluationPool } from "../lib/evaluation/pool";
import { READY_MESSAGE } from "../lib/evaluation/protocol";
import { evaluateTask } from "../lib/evaluation/tasks";
import { buildEvaluationBundle } from "./build-evaluation-bundle.mjs";
import { startingStandardFiles } from "./lib/starting-standards";

function median(values: number[]): number {
  const s = [...values].sort((a, b) => a - b);
  return s[Math.floor(s.length / 2)];
}

const ms = (value: number) => `${value.toFixed(2)} ms`;

async function timed<T>(work: () => Promise<T> | T): Promise<[T, number]> {
  const t = performance.now();
  const result = await work();
  return [result, performance.now() - t];
}

const outDir = fs.mkdtempSync(path.join(tmpdir(), "gusset-evaluation-bench-"));
try {
  const manifest = await buildEvaluationBundle({ outDir });
  const file = path.join(outDir, manifest.file);
  console.log(`${cpus().length} cores, load ${loadavg()[0].toFixed(1)}`);
  console.log(
    `bundle ${manifest.file}: ${(manifest.bytes / 1024).toFixed(0)} KiB, ${(manifest.gzipBytes / 1024).toFixed(0)} KiB gzipped`,
  );

  const starts: number[] = [];
  for (let i = 0; i < 5; i++) {
    const [worker, t] = await timed(
      () =>
        new Promise<Worker>((resolve, reject) => {
          const w = new Worker(file, { resourceLimits: { maxOldGenerationSizeMb: 256 } });
          w.once("message", (m) => (m === READY_MESSAGE ? resolve(w) : reject(new Error(String(m)))));
          w.once("error", reject);
        }),
    );
    starts.push(t);
    await worker.terminate();
  }
  console.log(`worker cold start (new Worker → bundle loaded), median of 5: ${ms(median(starts))}`);

  const beam = startingStandardFiles().find((s) => s.file === "simply-supported-beam/2.mdx")!.source;
  const pool = createEvaluationPool({ bundleDir: outDir, size: 1, timeoutMs: 60_000 });
  const [, first] = await timed(() => pool.evaluate(beam));
  console.log(`first evaluation on a cold pool (start, compile, evaluate): ${ms(first)}`);

  // Warm both sides; the source is compiled once on each (the compile cache), as a server evaluating a version repeatedly.
  for (let i = 0; i < 50; i++) {
    await pool.evaluate(beam, { L: `${5 + (i % 5)} m` });
    evaluateTask(beam, { L: `${5 + (i % 5)} m` });
  }
  const inProcess: number[] = [];
  const pooled: number[] = [];
  for (let i = 0; i < 200; i++) {
    const inputs = { L: `${5 + (i % 5)} m` };
    inProcess.push((await timed(() => evaluateTask(beam, inputs)))[1]);
    pooled.push((await timed(() => pool.evaluate(beam, inputs)))[1]);
  }
  const overhead = median(pooled) - median(inProcess);
  console.log(
    `evaluate simply-supported-beam/2 (with canonical JSON), median of 200: in-process ${ms(median(inProcess))}, ` +
      `pool ${ms(median(pooled))}, overhead ${ms(overhead)} per task`,
  );
  await pool.close();

  // A runaway that compiles: the multi-storey frame at the repetition limits under 40 more combinations.
  const frame = startingStandardFiles()
    .find((s) => s.file === "multi-storey-frame/1.mdx")!
    .source.replace(/max: 12 \}/g, "max: 1000 }")
    .replace(
      "  combinations:\n",
      '  combinations:\n    - { id: "X{k}", each: { k: "1 .. 40" }, factors: { D: "1 + k / 100", L: 1.6 } }\n',
    );
  const timeoutMs = 2_000;
  const limited = createEvaluationPool({ bundleDir: outDir, size: 1, timeoutMs, maxOldGenerationSizeMb: 2048 });
  await limited.compile(beam); // a started worker with the bundle loaded, so the time below is the timeout's alone
  for (let i = 0; i < 3; i++) {
    const [outcome, t] = await timed(() => limited.evaluate(frame, { n_bays: 49, n_storeys: 49 }));
    if (outcome.ok) throw new Error("the runaway finished");
    while (limited.stats().workers === 0 && limited.stats().lastKillMs === null) await new Promise((r) => setTimeout(r, 10));
    await new Promise((r) => setTimeout(r, 1_000)); // let the terminated thread exit
    console.log(
      `runaway ${i + 1}: ${outcome.reason} answered after ${ms(t)} (timeout ${timeoutMs} ms); ` +
        `terminate → thread exit ${ms(limited.stats().lastKillMs ?? NaN)}`,
    );
    await limited.compile(beam); // a fresh worker, loaded, for the next round
  }
  await limited.close();
} finally {
  fs.rmSync(outDir, { recursive: true, force: true });
}
