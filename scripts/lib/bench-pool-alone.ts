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

const sources = JSON.parse(fs.readFileSync(process.argv[2], "utf8")) as string[];

function threadCpuSeconds(): Map<number, { cpu: number; name: string }> {
  const ticks = 100; // USER_HZ on Linux
  const threads = new Map<number, { cpu: number; name: string }>();
  for (const tid of fs.readdirSync("/proc/self/task")) {
    try {
      const fields = fs.readFileSync(`/proc/self/task/${tid}/stat`, "utf8").split(") ")[1].split(" ");
      const name = fs.readFileSync(`/proc/self/task/${tid}/comm`, "utf8").trim();
      threads.set(Number(tid), { cpu: (Number(fields[11]) + Number(fields[12])) / ticks, name });
    } catch {
      // the thread ended between the listing and the read
    }
  }
  return threads;
}

const pool = createEvaluationPool({ size: 2 });
try {
  for (let i = 0; i < 10 * sources.length; i++) await pool.run(sources[i % sources.length], {}, {});
  const before = threadCpuSeconds();
  const runs = 200 * sources.length;
  let next = 0;
  await Promise.all(
    Array.from({ length: 20 }, async () => {
      while (next < runs) await pool.run(sources[next++ % sources.length], {}, {});
    }),
  );
  let workers = 0;
  let helpers = 0;
  for (const [tid, { cpu, name }] of threadCpuSeconds()) {
    if (tid === process.pid) continue;
    const used = cpu - (before.get(tid)?.cpu ?? 0);
    if (name === "gusset-eval") workers += used;
    else helpers += used;
  }
  console.log(JSON.stringify({ runs, workersMs: (workers * 1000) / runs, helpersMs: (helpers * 1000) / runs }));
} finally {
  await pool.close();
}
