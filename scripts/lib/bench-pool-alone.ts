/**
 * For `npm run bench:runs` (d): the standards whose sources are in the JSON file given, run in an evaluation pool of
 * this fresh process, 20 at a time after a warm-up; prints the CPU per run of the pool's workers (the threads named
 * "gusset-eval") and of the process's other threads but the main one (V8's helpers, which collect the workers'
 * garbage and compile their code too) as one line of JSON. A process of its own, so nothing else runs in it.
 *
 *   node --conditions=react-server --import tsx scripts/lib/bench-pool-alone.ts <sources.json>
 */
import fs from "node:fs";
import { createEvaluationPool } from "../../lib/evaluation/pool";
import { cpuByRole, threadCpu, threadDeltas } from "./thread-cpu";

const sources = JSON.parse(fs.readFileSync(process.argv[2], "utf8")) as string[];

const pool = createEvaluationPool({ size: 2 });
try {
  for (let i = 0; i < 10 * sources.length; i++) await pool.run(sources[i % sources.length], {}, {});
  const before = threadCpu(process.pid);
  const runs = 200 * sources.length;
  let next = 0;
  await Promise.all(
    Array.from({ length: 20 }, async () => {
      while (next < runs) await pool.run(sources[next++ % sources.length], {}, {});
    }),
  );
  const { evaluation, helpers } = cpuByRole(threadDeltas(before, threadCpu(process.pid)), process.pid);
  console.log(JSON.stringify({ runs, workersMs: (evaluation * 1000) / runs, helpersMs: (helpers * 1000) / runs }));
} finally {
  await pool.close();
}
