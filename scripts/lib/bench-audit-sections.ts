// The sections of `npm run bench:audit` (scripts/bench-audit.ts), each a function of the loaded benchmark database.
// The run log's pages and CSV export, and the verifiable log's sealer and integrity check (scripts/lib/bench-audit-log.ts);
// each gets the database as the app's role and as the owner, and the demo auditor to act as.

import pg from "pg";
import { DEMO_USERS } from "@/db/demo-users";
import type { Actor } from "@/lib/domain/actor";
import type { RunListQuery } from "@/lib/domain/schemas/run-log";
import { runUseCase } from "@/lib/use-cases/run";
import { exportRunLog, readRunLog } from "@/lib/use-cases/run-log";
import { runLogCsvStream } from "@/lib/use-cases/run-log-export";
import { benchIntegrityCheck, benchSealer } from "./bench-audit-log";

export type Bench = {
  /** The app's role, as the server connects (the use cases use their own pool on the same URL). */
  app: pg.Pool;
  /** The owner's role, for what the app may not do (loading in bulk, EXPLAIN of any query). */
  owner: pg.Pool;
  auditor: Actor;
  close: () => Promise<void>;
};

/** `id` names the section for `--only` (e.g. `npm run bench:audit -- --reuse --only integrity`). */
export type BenchSection = { id: string; title: string; run: (bench: Bench) => Promise<void> };

export async function openBench({ appUrl, ownerUrl }: { appUrl: string; ownerUrl: string }): Promise<Bench> {
  const app = new pg.Pool({ connectionString: appUrl, max: 2 });
  const owner = new pg.Pool({ connectionString: ownerUrl, max: 2 });
  const email = DEMO_USERS.find((u) => u.role === "auditor")!.email;
  const { rows } = await app.query<{ id: string; name: string }>(`select id, name from "user" where email = $1`, [email]);
  if (!rows[0]) throw new Error(`the demo auditor ${email} is not in the benchmark database: was it seeded?`);
  return {
    app,
    owner,
    auditor: { id: rows[0].id, name: rows[0].name, email, role: "auditor" },
    close: async () => {
      await Promise.all([app.end(), owner.end()]);
      const { pool } = await import("@/db");
      await pool.end();
    },
  };
}

const percentile = (sorted: number[], p: number) => sorted[Math.min(sorted.length - 1, Math.floor((p / 100) * sorted.length))];
const ms = (value: number) => `${value.toFixed(1)} ms`.padStart(9);

/** Queries that vary per call (a different job, person or month each time), so that not one page is measured. */
type Filter = { name: string; query: (k: number) => Partial<RunListQuery> };

async function benchValues(bench: Bench) {
  const one = async (sql: string) => (await bench.app.query(sql)).rows;
  const jobs = (await one(`select job_number from jobs where job_number like 'BA-%' order by job_number`)).map(
    (r) => r.job_number as string,
  );
  const people = (await one(`select id from "user" where id like 'bench-%' order by id`)).map((r) => r.id as string);
  const versions = (
    await one(`select s.slug, v.number from standard_versions v join standards s on s.id = v.standard_id order by 1, 2`)
  ).map((r) => ({ standard: r.slug as string, version: r.number as number }));
  const [{ first, last }] = await one(`select min(created_at) as first, max(created_at) as last from runs`);
  return { jobs, people, versions, first: new Date(first as string), last: new Date(last as string) };
}

const day = (date: Date) => date.toISOString().slice(0, 10);

function filtersOf(values: Awaited<ReturnType<typeof benchValues>>): Filter[] {
  const pick = <T>(list: T[], k: number) => list[(((k * 7919) % list.length) + list.length) % list.length];
  const month = (k: number) => {
    const span = values.last.getTime() - values.first.getTime() - 31 * 86_400_000;
    const start = new Date(values.first.getTime() + ((((k * 104_729) % 1000) + 1000) % 1000) * (span / 1000));
    return { from: day(start), to: day(new Date(start.getTime() + 30 * 86_400_000)) };
  };
  return [
    { name: "no filter, newest first", query: () => ({}) },
    { name: "by job", query: (k) => ({ job: pick(values.jobs, k) }) },
    { name: "by standard and version", query: (k) => pick(values.versions, k) },
    { name: "by person", query: (k) => ({ person: pick(values.people, k) }) },
    { name: "failed in the engine", query: () => ({ outcome: "failed" }) },
    { name: "a check fails", query: () => ({ pass: "false" }) },
    { name: "a month", query: (k) => month(k) },
    { name: "signed off: approved", query: () => ({ signOff: "approved" }) },
    { name: "largest utilisation first", query: () => ({ sort: "utilisation" }) },
    { name: "by job number", query: () => ({ sort: "job" }) },
    {
      name: "combined: job, check fails, a year",
      query: (k) => ({
        job: pick(values.jobs, k),
        pass: "false",
        ...month(k),
        to: day(new Date(Date.parse(month(k).from) + 365 * 86_400_000)),
      }),
    },
    {
      name: "combined: person, standard, by utilisation",
      query: (k) => ({ person: pick(values.people, k), standard: pick(values.versions, k).standard, sort: "utilisation" }),
    },
  ];
}

/** p50 and p95 of a page of the run log (50 rows) through the page's own use case, and of the page after it. */
const runLogPages: BenchSection = {
  id: "pages",
  title: "Run log pages: runUseCase(readRunLog) — the use case /audit/runs renders, its one query lib/data/run-list.ts listRuns",
  run: async (bench) => {
    const values = await benchValues(bench);
    const calls = 60;
    console.log(`${"filter".padEnd(44)}${"p50".padStart(9)}${"p95".padStart(9)}  ${"next page p95".padStart(13)}  rows`);
    for (const filter of filtersOf(values)) {
      const first: number[] = [];
      const next: number[] = [];
      let rows = 0;
      for (let k = -5; k < calls; k++) {
        const input = { ...filter.query(k), limit: 50 };
        let t = performance.now();
        const page = await runUseCase(readRunLog, { actor: bench.auditor, input });
        const elapsed = performance.now() - t;
        if (k < 0) continue; // warm-up
        first.push(elapsed);
        rows += page.runs.length;
        if (page.nextCursor) {
          t = performance.now();
          await runUseCase(readRunLog, { actor: bench.auditor, input: { ...input, cursor: page.nextCursor } });
          next.push(performance.now() - t);
        }
      }
      first.sort((a, b) => a - b);
      next.sort((a, b) => a - b);
      console.log(
        `${filter.name.padEnd(44)}${ms(percentile(first, 50))}${ms(percentile(first, 95))}  ${next.length ? ms(percentile(next, 95)).padStart(13) : "—".padStart(13)}  ${(rows / calls).toFixed(0)}`,
      );
    }
    console.log(`(${calls} calls each after 5 to warm up, each call with another job, person, version or month)`);
  },
};

/** The CSV export of every run: the export use case, then its stream read to the end. */
const csvExport: BenchSection = {
  id: "csv",
  title: "CSV export: runUseCase(exportRunLog) then runLogCsvStream — what GET /api/runs/export sends",
  run: async (bench) => {
    for (const [name, input] of [
      ["every run", {}],
      ["a check fails", { pass: "false" }],
    ] as const) {
      const t = performance.now();
      const started = await runUseCase(exportRunLog, { actor: bench.auditor, input });
      const reader = runLogCsvStream(started).getReader();
      let bytes = 0;
      let lines = 0;
      for (;;) {
        const { done, value } = await reader.read();
        if (done) break;
        bytes += value.byteLength;
        for (let i = 0; i < value.length; i++) if (value[i] === 10) lines++;
      }
      const seconds = (performance.now() - t) / 1000;
      const rows = lines - 1;
      console.log(
        `${name.padEnd(20)} ${rows} rows, ${(bytes / 1e6).toFixed(1)} MB in ${seconds.toFixed(1)} s: ${Math.round(rows / seconds)} rows/s, ${(bytes / 1e6 / seconds).toFixed(1)} MB/s; heap ${Math.round(process.memoryUsage().heapUsed / 1e6)} MB`,
      );
    }
  },
};

/** The sealer over the load's backlog: every run loaded left its leaf waiting (the trigger writes it with the row). */
const logSealer: BenchSection = {
  id: "sealer",
  title: "Verifiable log: the sealer folds the waiting leaves into signed tree heads (lib/jobs/sealer.ts sealAll)",
  run: async () => {
    await benchSealer();
  },
};

/** The whole integrity check, as the Integrity page and `npm run verify-integrity` run it. */
const integrityCheck: BenchSection = {
  id: "integrity",
  title: "Verifiable log: the whole integrity check (lib/use-cases/integrity-check.ts)",
  run: async () => {
    await benchIntegrityCheck();
  },
};

export const BENCH_SECTIONS: BenchSection[] = [logSealer, runLogPages, csvExport, integrityCheck];
