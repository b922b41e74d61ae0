/**
 * npm run bench:runs — what running standards costs on the production server `npm start` serves (start it first),
 * measured in one run:
 *   (a) the framework's floor: GET /api/me (signed in, trivial) from 20 concurrent clients, requests/s;
 *   (b) POST /api/runs of the starting standards (each at its defaults, in turn) from 20 concurrent clients,
 *       runs/s and latency p50/p95/p99 (scripts/serve.mjs answers this route itself, without Next's router, so a
 *       run's main-thread CPU no longer includes (a)'s floor: see DEVELOPERS.md);
 *   (c) runs offered at a steady 20 per second (open loop), latency p50/p95/p99;
 *   (d) the server's CPU per run (its process, all threads, from /proc), split by thread: the evaluation is the
 *       CPU of the evaluation pool's worker threads (named "gusset-eval" by lib/evaluation/entry.ts); the rest is
 *       the overhead, split into the main thread (framework, storage) and V8's own helper threads (garbage
 *       collection, compilation), which serve the workers' isolates too: the same mix run in a pool of a process
 *       of its own shows that share; plus, for reference, the same standards evaluated in this process. Measured
 *       warm: a minute of runs goes first, unmeasured, while V8 compiles a fresh server's hot code;
 * then counts the runs stored against the 2xx answers: every acknowledged run stored, none twice.
 * Also the run page's server render time. Runs go into a job of their own (BENCH-…), closed afterwards.
 *
 *   npm run bench:runs [-- --seconds 10]
 *   npm run bench:runs -- --only sheets    only the calc sheet PDFs: one run of each standard, new and kept
 */
import { execFileSync } from "node:child_process";
import fs from "node:fs";
import { cpus, loadavg, tmpdir } from "node:os";
import path from "node:path";
import pg from "pg";
import { databaseUrlFor, portsFor } from "./lib/env.mjs";
import {
  cpuByRole,
  EVALUATION_THREAD_NAME,
  processCpuSeconds,
  processTreeCpuSeconds,
  threadCpu,
  threadDeltas,
} from "./lib/thread-cpu";
import { DEMO_USERS } from "../db/demo-users";
import { runStandardTask } from "../lib/evaluation/tasks";

const seconds = Number(process.argv[process.argv.indexOf("--seconds") + 1]) || 10;
const onlySheets = process.argv[process.argv.indexOf("--only") + 1] === "sheets";
// BENCH_APP_PORT: another server of the same build on this machine (a profiled one, say); `npm start`'s by default.
const appPort = Number(process.env.BENCH_APP_PORT) || portsFor("start").app;
const base = `http://127.0.0.1:${appPort}`;
const CLIENTS = 20;

const percentile = (values: number[], p: number) => {
  const sorted = [...values].sort((a, b) => a - b);
  return sorted[Math.min(sorted.length - 1, Math.floor((p / 100) * sorted.length))] ?? NaN;
};
const ms = (value: number) => `${value.toFixed(1)} ms`;

function serverPid(): number {
  const out = execFileSync("ss", ["-ltnpH", `sport = :${appPort}`], { encoding: "utf8" });
  const match = /pid=(\d+)/.exec(out);
  if (!match) throw new Error(`nothing listens on ${base}: start the app with \`npm start\` first`);
  return Number(match[1]);
}

/**
 * The mix run in an evaluation pool of a fresh process (scripts/lib/bench-pool-alone.ts): CPU per run of the pool's
 * workers and of V8's helper threads, which collect the workers' garbage too.
 */
function poolAlone(sources: string[]): { runs: number; workersMs: number; helpersMs: number } {
  const file = path.join(tmpdir(), `gusset-bench-pool-${process.pid}.json`);
  fs.writeFileSync(file, JSON.stringify(sources));
  try {
    const out = execFileSync(
      process.execPath,
      ["--conditions=react-server", "--import", "tsx", "scripts/lib/bench-pool-alone.ts", file],
      { encoding: "utf8" },
    );
    return JSON.parse(out.trim().split("\n").at(-1)!) as { runs: number; workersMs: number; helpersMs: number };
  } finally {
    fs.rmSync(file, { force: true });
  }
}

async function signIn(): Promise<string> {
  const engineer = DEMO_USERS.find((u) => u.role === "engineer")!;
  const response = await fetch(`${base}/api/auth/sign-in/email`, {
    method: "POST",
    headers: { "content-type": "application/json", origin: base },
    body: JSON.stringify({ email: engineer.email, password: engineer.password }),
  });
  if (!response.ok) throw new Error(`signing in as ${engineer.email} failed: ${response.status}`);
  return response.headers
    .getSetCookie()
    .map((c) => c.split(";")[0])
    .join("; ");
}

/** `clients` loops each sending requests until the time is up; the latency of each answer and its status. */
async function closedLoop(clients: number, durationS: number, send: (k: number) => Promise<Response>) {
  const results: { ms: number; status: number; body: unknown }[] = [];
  const end = performance.now() + durationS * 1000;
  let k = 0;
  await Promise.all(
    Array.from({ length: clients }, async () => {
      while (performance.now() < end) {
        const t = performance.now();
        const response = await send(k++);
        const body = await response.json().catch(() => null);
        results.push({ ms: performance.now() - t, status: response.status, body });
      }
    }),
  );
  return results;
}

/** Requests started at a steady rate whatever the answers do; the latency of each. */
async function openLoop(rate: number, durationS: number, send: (k: number) => Promise<Response>) {
  const results: { ms: number; status: number; body: unknown }[] = [];
  const pending: Promise<void>[] = [];
  const start = performance.now();
  for (let k = 0; k < rate * durationS; k++) {
    const due = start + (k * 1000) / rate;
    const wait = due - performance.now();
    if (wait > 0) await new Promise((resolve) => setTimeout(resolve, wait));
    const t = performance.now();
    pending.push(
      send(k).then(async (response) => {
        const body = await response.json().catch(() => null);
        results.push({ ms: performance.now() - t, status: response.status, body });
      }),
    );
  }
  await Promise.all(pending);
  return results;
}

async function main() {
  const pid = serverPid();
  const cookie = await signIn();
  const db = new pg.Client({ connectionString: databaseUrlFor("start", "app") });
  await db.connect();
  const versions = (
    await db.query<{ id: string; slug: string; source: string }>(
      `select distinct on (s.slug) v.id, s.slug, v.source
         from standard_versions v join standards s on s.id = v.standard_id
        where not exists (select 1 from standard_version_events e where e.version_id = v.id and e.kind = 'withdrawn')
        order by s.slug, v.number desc`,
    )
  ).rows;
  const usesLibraries = (source: string) => /quantity:\s*(section|material)\s*[,}\n]/.test(source);
  const mix = versions.filter((v) => !usesLibraries(v.source));
  const { rows: people } = await db.query<{ id: string }>(`select id from "user" where email = $1`, [
    DEMO_USERS.find((u) => u.role === "engineer")!.email,
  ]);
  const jobNumber = `BENCH-${Date.now().toString(36).toUpperCase()}`;
  const {
    rows: [job],
  } = await db.query<{ id: string }>(
    `insert into jobs (job_number, name, responsible_engineer_id, created_by_id) values ($1, 'Benchmark runs (npm run bench:runs)', $2, $2) returning id`,
    [jobNumber, people[0].id],
  );
  const headers = { cookie, origin: base, "content-type": "application/json" };
  const postRun = (k: number) =>
    fetch(`${base}/api/runs`, {
      method: "POST",
      headers,
      body: JSON.stringify({ jobId: job.id, versionId: mix[k % mix.length].id, inputs: {} }),
    });

  console.log(`bench:runs against ${base} (server pid ${pid}), ${cpus().length} cores, load ${loadavg()[0].toFixed(2)}`);
  console.log(`standards in the mix (at their defaults): ${mix.map((v) => v.slug).join(", ")}`);
  // Warm-up: the pool's workers start and compile each standard once.
  let warmUp = 0;
  // Who answers POST /api/runs: scripts/serve.mjs itself, or Next (no direct routes bundled for this build). Next's
  // router marks its route handlers' answers with Vary (for its client-side cache); serve.mjs's answers have none.
  let servedBy = "";
  for (; warmUp < mix.length * 2; warmUp++) {
    const response = await postRun(warmUp);
    servedBy = response.headers.get("vary") ? "through Next's router" : "by scripts/serve.mjs itself, without Next's router";
    await response.json();
  }
  console.log(`POST /api/runs is answered ${servedBy}`);
  if (onlySheets) {
    // The runs sealed first (the worker's sealer, every few seconds), so that each sheet keeps one state meanwhile.
    await new Promise((resolve) => setTimeout(resolve, 10_000));
    await measureSheetPdfs(db, job.id, cookie);
    await db.query(`update jobs set status = 'closed' where id = $1`, [job.id]);
    await db.end();
    return;
  }

  // Then a minute of runs (six times --seconds), unmeasured, in windows of 3 s: V8 compiles and recompiles the hot
  // code of a freshly started server (the route, the database driver, drizzle) for a minute or more, which a server
  // that runs for days pays once. The overhead per run (all threads but the evaluation's) of each window is printed,
  // so the cold figures are on record too.
  const windows: string[] = [];
  for (let w = 0; w < Math.max(1, Math.round((6 * seconds) / 3)); w++) {
    const before = threadCpu(pid);
    const done = (await closedLoop(CLIENTS, 3, postRun)).length;
    warmUp += done;
    const { main, helpers } = cpuByRole(threadDeltas(before, threadCpu(pid)), pid);
    windows.push((((main + helpers) * 1000) / Math.max(1, done)).toFixed(1));
  }
  console.log(`warm-up: ${warmUp} runs; overhead per run in each 3 s window, ms: ${windows.join(", ")}`);

  // (a) the framework's floor.
  let cpu = processCpuSeconds(pid);
  let threads = threadCpu(pid);
  const floor = await closedLoop(CLIENTS, seconds, () => fetch(`${base}/api/me`, { headers: { cookie } }));
  const floorCpuMs = ((processCpuSeconds(pid) - cpu) * 1000) / floor.length;
  const floorThreads = threadDeltas(threads, threadCpu(pid));
  console.log(
    `(a) GET /api/me, ${CLIENTS} clients: ${(floor.length / seconds).toFixed(0)} requests/s, p50 ${ms(
      percentile(
        floor.map((r) => r.ms),
        50,
      ),
    )}, server CPU ${floorCpuMs.toFixed(2)} ms/request`,
  );

  // (b) closed loop of runs. PostgreSQL and the worker (which seals the log) share the machine: their CPU is read too.
  const postgres = new RegExp(`postgres -D .*port=${portsFor("start").postgres}\\b`);
  const worker = /scripts\/worker\.ts/;
  const others = () => [processTreeCpuSeconds(postgres), processTreeCpuSeconds(worker)];
  const othersBefore = others();
  cpu = processCpuSeconds(pid);
  threads = threadCpu(pid);
  const closed = await closedLoop(CLIENTS, seconds, postRun);
  const closedCpuMs = ((processCpuSeconds(pid) - cpu) * 1000) / closed.length;
  const closedThreads = threadDeltas(threads, threadCpu(pid));
  const [postgresMs, workerMs] = others().map((after, i) => ((after - othersBefore[i]) * 1000) / closed.length);
  const lat = closed.map((r) => r.ms);
  console.log(
    `(b) POST /api/runs, ${CLIENTS} clients: ${(closed.length / seconds).toFixed(1)} runs/s, p50 ${ms(percentile(lat, 50))}, p95 ${ms(percentile(lat, 95))}, p99 ${ms(percentile(lat, 99))}; statuses ${JSON.stringify(countBy(closed.map((r) => r.status)))}`,
  );

  // (c) open loop at 20 runs/s, its CPU read too: (d) at a load that leaves the machine cores to spare.
  const openBefore = threadCpu(pid);
  const open = await openLoop(20, seconds, postRun);
  const openThreads = threadDeltas(openBefore, threadCpu(pid));
  const openLat = open.map((r) => r.ms);
  console.log(
    `(c) 20 runs/s offered (open loop): p50 ${ms(percentile(openLat, 50))}, p95 ${ms(percentile(openLat, 95))}, p99 ${ms(percentile(openLat, 99))}; statuses ${JSON.stringify(countBy(open.map((r) => r.status)))}`,
  );

  // (d) the CPU per run, split by thread. The pool's workers evaluate and do nothing else: they name their threads
  // "gusset-eval". (A server of an older build leaves them unnamed; then they are told by what they did: no CPU
  // while (a) ran, under 2 % of what they used in (b), and some in (b).) The main thread is the process's own id;
  // the rest are V8's helpers (garbage collection, compilation) and libuv's.
  const perRun = (used: number) => (used * 1000) / closed.length;
  const named = [...closedThreads.values()].some((thread) => thread.name === EVALUATION_THREAD_NAME);
  const {
    main: mainCpu,
    evaluation: evaluationCpu,
    evaluationThreads,
    helpers: helpersCpu,
  } = cpuByRole(closedThreads, pid, (tid, { cpu: used, name }) =>
    named ? name === EVALUATION_THREAD_NAME : (floorThreads.get(tid)?.cpu ?? 0) <= 0.02 * used && used > 0,
  );
  const evaluationMs = mix.map((v) => {
    runStandardTask(v.source, {}, {});
    const t = process.cpuUsage();
    const n = 20;
    for (let i = 0; i < n; i++) runStandardTask(v.source, {}, {});
    const used = process.cpuUsage(t);
    return (used.user + used.system) / 1000 / n;
  });
  const inProcess = evaluationMs.reduce((a, b) => a + b, 0) / evaluationMs.length;
  console.log(
    `(d) server CPU per run ${closedCpuMs.toFixed(2)} ms: evaluation ${perRun(evaluationCpu).toFixed(2)} ms (${evaluationThreads} worker threads${named ? ", by name" : ", told by use"}); overhead beyond the evaluation ${(closedCpuMs - perRun(evaluationCpu)).toFixed(2)} ms = main thread ${perRun(mainCpu).toFixed(2)} ms (answered ${servedBy}; a request through Next costs (a)'s ${floorCpuMs.toFixed(2)} ms) + V8's helper threads ${perRun(helpersCpu).toFixed(2)} ms`,
  );
  {
    // The same split while (c) offered 20 runs a second.
    const per = (used: number) => (used * 1000) / Math.max(1, open.length);
    const { main, evaluation, helpers } = cpuByRole(openThreads, pid);
    console.log(
      `    the same at 20 runs/s ((c), cores to spare): evaluation ${per(evaluation).toFixed(2)} ms; overhead ${per(main + helpers).toFixed(2)} ms = main thread ${per(main).toFixed(2)} ms + V8's helper threads ${per(helpers).toFixed(2)} ms`,
    );
  }
  console.log(
    `    not counted above, the other processes on the machine meanwhile, per run: PostgreSQL ${postgresMs.toFixed(2)} ms, the worker (sealing the log) ${workerMs.toFixed(2)} ms`,
  );
  console.log(
    `    for reference, the same standards evaluated once each in this process (cold-ish, 20 times each): ${inProcess.toFixed(2)} ms on average (${mix.map((v, i) => `${v.slug} ${evaluationMs[i].toFixed(2)}`).join(", ")})`,
  );
  // V8's helper threads serve every isolate of the process, the pool's workers too: part of what they used in (b)
  // is the evaluation's own garbage collection and compilation. The same mix in a pool of a process that does
  // nothing else shows how much.
  const alone = poolAlone(mix.map((v) => v.source));
  const overheadMs = closedCpuMs - perRun(evaluationCpu);
  console.log(
    `    the same mix in an evaluation pool of a process of its own (${alone.runs} runs, 20 at a time): workers ${alone.workersMs.toFixed(2)} ms, V8's helper threads ${alone.helpersMs.toFixed(2)} ms per run; so the server's overhead net of the evaluation's own helper work (at most all its helper threads used) is about ${(overheadMs - Math.min(alone.helpersMs, perRun(helpersCpu))).toFixed(2)} ms per run`,
  );

  // Every acknowledged run stored, none twice.
  const acknowledged = [...closed, ...open]
    .filter((r) => r.status === 201)
    .map((r) => (r.body as { data: { id: string } }).data.id);
  const { rows } = await db.query<{ id: string }>(`select id from runs where job_id = $1`, [job.id]);
  const stored = new Set(rows.map((r) => r.id));
  const missing = acknowledged.filter((id) => !stored.has(id));
  console.log(
    `stored: ${rows.length} runs in ${jobNumber} (${warmUp} warm-up); acknowledged ${acknowledged.length}, of which missing ${missing.length}, duplicated ${acknowledged.length - new Set(acknowledged).size}`,
  );
  const { rows: sizes } = await db.query<{ slug: string; bytes: number }>(
    `select s.slug, max(r.record_bytes) as bytes from runs r join standard_versions v on v.id = r.version_id
       join standards s on s.id = v.standard_id where r.job_id = $1 group by s.slug order by s.slug`,
    [job.id],
  );
  console.log(`record size per standard: ${sizes.map((s) => `${s.slug} ${(s.bytes / 1024).toFixed(1)} KiB`).join(", ")}`);

  // The run page's server render time.
  const runId = acknowledged[0];
  const renders: number[] = [];
  for (let i = 0; i < 20; i++) {
    const t = performance.now();
    const response = await fetch(`${base}/runs/${runId}`, { headers: { cookie } });
    await response.text();
    renders.push(performance.now() - t);
  }
  console.log(
    `run page /runs/{id}: p50 ${ms(percentile(renders, 50))}, p95 ${ms(percentile(renders, 95))} (server render and transfer)`,
  );

  // The calc sheet page's server render time, and its PDF: rendered by the server's Chromium the first time a state
  // of the sheet is asked for, then served as kept (from S3).
  const sheetRenders: number[] = [];
  for (let i = 0; i < 20; i++) {
    const t = performance.now();
    await (await fetch(`${base}/runs/${runId}/sheet`, { headers: { cookie } })).text();
    sheetRenders.push(performance.now() - t);
  }
  console.log(
    `calc sheet /runs/{id}/sheet: p50 ${ms(percentile(sheetRenders, 50))}, p95 ${ms(percentile(sheetRenders, 95))} (server render and transfer)`,
  );
  await measureSheetPdfs(db, job.id, cookie);

  await db.query(`update jobs set status = 'closed' where id = $1`, [job.id]);
  await db.end();
}

/**
 * The calc sheet PDF of one run of each standard in the job: the first ask renders it in the server's Chromium and
 * keeps it; the next asks serve the kept PDF by the sheet's key, without Chromium (median of five).
 */
async function measureSheetPdfs(db: pg.Client, jobId: string, cookie: string) {
  const { rows: perStandard } = await db.query<{ id: string; slug: string }>(
    `select distinct on (s.slug) r.id, s.slug from runs r join standard_versions v on v.id = r.version_id
       join standards s on s.id = v.standard_id where r.job_id = $1 and r.outcome = 'succeeded' order by s.slug, r.created_at`,
    [jobId],
  );
  const pdfTimes: string[] = [];
  for (const run of perStandard) {
    const timed = async () => {
      const t = performance.now();
      const response = await fetch(`${base}/api/runs/${run.id}/sheet-pdf`, { headers: { cookie } });
      const bytes = (await response.arrayBuffer()).byteLength;
      if (response.status !== 200) throw new Error(`sheet PDF of ${run.slug}: status ${response.status}`);
      return { ms: performance.now() - t, bytes, sha256: response.headers.get("x-content-sha256") };
    };
    const rendered = await timed();
    const kept = [];
    for (let i = 0; i < 5; i++) kept.push(await timed());
    const same = kept.every((k) => k.sha256 === rendered.sha256) ? "" : " (another state kept since: sealed meanwhile?)";
    pdfTimes.push(
      `${run.slug} ${ms(rendered.ms)} new / ${ms(
        percentile(
          kept.map((k) => k.ms),
          50,
        ),
      )} kept (${(rendered.bytes / 1024).toFixed(0)} KiB)${same}`,
    );
  }
  console.log(`calc sheet PDF per standard: ${pdfTimes.join(", ")}`);
}

function countBy(values: number[]): Record<string, number> {
  const out: Record<string, number> = {};
  for (const v of values) out[v] = (out[v] ?? 0) + 1;
  return out;
}

await main();
