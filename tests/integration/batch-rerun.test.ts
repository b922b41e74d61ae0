// A batch re-run of 500 runs after a withdrawal survives a worker killed mid-way: a worker process of its own (started
// as `npm test` starts the tests' worker: scripts/worker.ts under tsx) takes part, is killed with SIGKILL while the
// batch runs, and another is started. pg-boss delivers at least once (the killed worker's jobs expire after the
// queue's short expiry and are retried): in the end every affected run was re-run exactly once on the successor,
// with its inputs mapped, as a remediation run whose parent is the original (closed jobs included); re-runs whose
// mapped inputs the successor refuses are counted as failed with their message. Nothing lost, nothing doubled.
import { spawn, type ChildProcess } from "node:child_process";
import fs from "node:fs";
import os from "node:os";
import path from "node:path";
import { afterAll, describe, expect, it } from "vitest";
import { sql } from "drizzle-orm";
import { db } from "@/db";
import { runUseCase } from "@/lib/use-cases/run";
import { withdrawVersion } from "@/lib/use-cases/standards";
import { updateJob } from "@/lib/use-cases/jobs";
import { startBatch, readBatchProgress } from "@/lib/use-cases/batch-reruns";
import { readRunRecord } from "@/lib/standards/run-record";
import { createTestUser } from "./helpers/people";
import { jobFor, runIn, standardWithTwoVersions } from "./helpers/withdrawal-fixtures";

const RUNS = 500;
const repoRoot = path.resolve(import.meta.dirname, "..", "..");
const started: ChildProcess[] = [];

/** A worker process like the one `npm test` starts; resolves once it says it is working. */
async function startWorkerProcess(label: string): Promise<ChildProcess> {
  const log = path.join(os.tmpdir(), `gusset-batch-${label}-${process.pid}.log`);
  const out = fs.openSync(log, "w");
  // Node itself with tsx as a loader, not the tsx wrapper: the wrapper is a process of its own, and a SIGKILL to it would
  // leave the real worker running on. --parent-pid ends the worker should this test process go away.
  const child = spawn(
    process.execPath,
    ["--import", "tsx", "--conditions=react-server", "scripts/worker.ts", "--parent-pid", String(process.pid)],
    { cwd: repoRoot, env: process.env, stdio: ["ignore", out, out] },
  );
  started.push(child);
  const deadline = Date.now() + 60_000;
  while (!fs.readFileSync(log, "utf8").includes("[gusset-worker] working on")) {
    if (child.exitCode !== null) throw new Error(`the ${label} worker exited: ${fs.readFileSync(log, "utf8")}`);
    if (Date.now() > deadline) throw new Error(`the ${label} worker did not start: ${fs.readFileSync(log, "utf8")}`);
    await new Promise((resolve) => setTimeout(resolve, 200));
  }
  return child;
}

afterAll(async () => {
  for (const child of started) if (child.exitCode === null && child.signalCode === null) child.kill("SIGTERM");
  // Should the test fail half-way, the tests' own worker must not go on re-running the rest of the batch in the
  // background while later test files compare the database before and after their calls.
  await db.execute(sql`delete from pgboss.job where name = 'rerun.item' and state in ('created', 'retry')`);
});

const count = async (query: ReturnType<typeof sql>) => Number(((await db.execute(query)).rows[0] as { n: string }).n);

describe("a batch re-run", () => {
  it("re-runs 500 runs once each although a worker is killed mid-way", { timeout: 15 * 60_000 }, async () => {
    const { v1, v2 } = await standardWithTwoVersions("batch");
    const [{ actor: engineer }, { actor: responsible }, { actor: lead }] = await Promise.all([
      createTestUser({ role: "engineer", label: "batch-eng" }),
      createTestUser({ role: "engineer", label: "batch-resp" }),
      createTestUser({ role: "lead", label: "batch-lead" }),
    ]);
    const jobs = await Promise.all([0, 1, 2, 3, 4].map(() => jobFor(engineer, responsible)));
    // Spans from 3 m to 9 m (some will fail in bending on v2 with the added load), and every 50th at 25 m, which v2
    // (at most 20 m) refuses: those re-runs fail with the successor's message.
    const spanOf = (i: number) => (i % 50 === 7 ? "25 m" : `${3 + (i % 7)} m`);
    const originals: string[] = [];
    for (let i = 0; i < RUNS; i += 10) {
      const made = await Promise.all(
        Array.from({ length: 10 }, (_, k) => runIn(engineer, jobs[(i + k) % 5].jobId, v1, { L: spanOf(i + k) })),
      );
      originals.push(...made.map((run) => run.id));
    }
    const refused = originals.filter((_, i) => spanOf(i) === "25 m").length;
    // Closed jobs are re-run too (as remediation).
    await runUseCase(updateJob, {
      actor: engineer,
      input: {
        jobId: jobs[4].jobId,
        jobNumber: jobs[4].jobNumber,
        name: "Closed job",
        responsibleEngineerId: responsible.id,
        status: "closed",
      },
    });

    const { withdrawalId } = await runUseCase(withdrawVersion, {
      actor: lead,
      input: {
        versionId: v1,
        reason: "The load factor is wrong.",
        successorVersionId: v2,
        mapping: { rename: { w: "q" }, values: { w_add: "30 kN/m" } },
      },
    });

    const first = await startWorkerProcess("first");
    const { batchId, runs } = await runUseCase(startBatch, { actor: lead, input: { withdrawalId } });
    expect(runs).toBe(RUNS);
    const done = () => count(sql`select count(*) as n from rerun_batch_items where batch_id = ${batchId}`);
    // Kill the first worker mid-way, at a moment when jobs are active (the tests' own worker takes jobs of the batch
    // too, so "active" may be momentarily zero between fetches: wait for a moment when it is not), then start another.
    const active = () => count(sql`select count(*) as n from pgboss.job where name = 'rerun.item' and state = 'active'`);
    const waitUntil = Date.now() + 120_000;
    let activeAtKill = 0;
    while ((await done()) < RUNS / 5 || (activeAtKill = await active()) === 0) {
      if (Date.now() > waitUntil) break;
      await new Promise((resolve) => setTimeout(resolve, 50));
    }
    first.kill("SIGKILL");
    const doneAtKill = await done();
    expect(doneAtKill).toBeLessThan(RUNS);
    expect(activeAtKill).toBeGreaterThan(0);
    await startWorkerProcess("second");

    const deadline = Date.now() + 10 * 60_000;
    while ((await done()) < RUNS) {
      if (Date.now() > deadline) throw new Error(`the batch stalled at ${await done()} of ${RUNS}`);
      await new Promise((resolve) => setTimeout(resolve, 500));
    }

    // None lost, none doubled: one item per original, one remediation run per original that was run.
    const items = (
      await db.execute(
        sql`select original_run_id, new_run_id, status, message from rerun_batch_items where batch_id = ${batchId}`,
      )
    ).rows as { original_run_id: string; new_run_id: string | null; status: string; message: string | null }[];
    expect(items).toHaveLength(RUNS);
    expect(new Set(items.map((i) => i.original_run_id))).toEqual(new Set(originals));
    const children = (
      await db.execute(sql`select parent_run_id, count(*) as n from runs where purpose = 'remediation'
                              and parent_run_id in (select original_run_id from rerun_batch_items where batch_id = ${batchId})
                            group by parent_run_id`)
    ).rows as { parent_run_id: string; n: string }[];
    expect(children.filter((c) => Number(c.n) !== 1)).toEqual([]);
    expect(children).toHaveLength(RUNS - refused);
    const failed = items.filter((i) => i.status === "failed");
    expect(failed).toHaveLength(refused);
    for (const item of failed) {
      expect(item.new_run_id).toBeNull();
      expect(item.message).toMatch(/Span: 25 m is above the maximum 20 m/);
    }

    // The re-runs: on v2, inputs mapped, linked to their originals, in their own jobs (the closed one too).
    const sample = items.find((i) => i.new_run_id !== null)!;
    const [row] = (
      await db.execute(sql`select version_id, job_id, record, parent_run_id from runs where id = ${sample.new_run_id}`)
    ).rows as { version_id: string; job_id: string; record: string; parent_run_id: string }[];
    expect(row.version_id).toBe(v2);
    expect(row.parent_run_id).toBe(sample.original_run_id);
    const record = readRunRecord(row.record);
    expect(record.purpose).toBe("remediation");
    expect(Object.keys(record.typed).sort()).toEqual(["A_g", "E", "F_y", "I_x", "L", "Z_x", "q", "w_add"]);
    expect(record.typed.q).toBe("10 kN/m");
    expect(record.typed.w_add).toBe("30 kN/m");
    const inClosed = await count(sql`select count(*) as n from runs where purpose = 'remediation' and job_id = ${jobs[4].jobId}`);
    expect(inClosed).toBeGreaterThan(90);
    // Each stored re-run has its audit event, once.
    const audited = await count(sql`select count(*) as n from audit_events where action = 'runs.create'
      and details->>'purpose' = 'remediation' and subject in (select 'run:' || new_run_id from rerun_batch_items where batch_id = ${batchId})`);
    expect(audited).toBe(RUNS - refused);

    const progress = await runUseCase(readBatchProgress, { actor: lead, input: { id: withdrawalId } });
    expect(progress.batch).toMatchObject({ total: RUNS, done: RUNS, failed: refused, stalledForMs: null });
    // Its latest re-run finished after it started, and a finished batch is never said to be stalled.
    expect(Date.parse(progress.batch!.lastFinishedAt!)).toBeGreaterThan(Date.parse(progress.batch!.startedAt));
    expect(progress.batch!.passToFail).toBeGreaterThan(0);
    // The delta table leads with the checks that went from pass to fail.
    expect(progress.deltas[0].newlyFailing).toBeGreaterThan(0);
    console.info(
      `[batch-rerun] ${RUNS} re-runs; ${doneAtKill} done when the first worker was killed holding ${activeAtKill} active jobs`,
    );
  });
});
