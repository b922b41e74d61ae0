/**
 * npm run bench:audit — the QA audit on a million runs, in a database of its own (gusset_bench_audit: never the demo's
 * `gusset` nor the tests' `gusset_test`), on the checkout's own PostgreSQL (started when not running, stopped after):
 *   1. the database is dropped, made again, migrated and seeded as `npm start` does (the demo firm and the starting
 *      standards; the fake S3 holds the hand calculations the seed stores);
 *   2. each published version of the starting standards is run once at its defaults through the run use case, and
 *      those records are the templates of 1,000,000 runs spread over a few hundred jobs, a few dozen people and three
 *      years (scripts/lib/bench-audit-load.ts), with calc revisions signed off to each step for some of them;
 *   3. each section of scripts/lib/bench-audit-sections.ts runs against it and prints its figures.
 *
 *   npm run bench:audit [-- --runs 1000000] [-- --reuse] [-- --only integrity,pages]
 *     --reuse: keep a database loaded by an earlier run; --only: these sections alone (sealer, pages, csv, integrity)
 */
import { execFileSync } from "node:child_process";
import fs from "node:fs";
import path from "node:path";
import { prepareBenchDatabase } from "./lib/bench-database.mjs";

export const BENCH_DATABASE = "gusset_bench_audit";

const argument = (name: string) => {
  const at = process.argv.indexOf(name);
  return at === -1 ? undefined : (process.argv[at + 1] ?? "");
};
const runs = Number(argument("--runs") ?? 1_000_000);
const reuse = process.argv.includes("--reuse");
const only = argument("--only")?.split(",").filter(Boolean);
if (!Number.isInteger(runs) || runs < 1000) throw new Error("--runs takes a whole number of at least 1000");

let stop = async () => {};

async function main(): Promise<void> {
  const database = await prepareBenchDatabase({
    database: BENCH_DATABASE,
    keepIf: (query) => reuse && Number(query("select count(*) from runs") || 0) >= runs,
  });
  stop = database.stop;
  // The data and use-case layers read their settings once, from this process's environment: the bench database's.
  Object.assign(process.env, database.env);
  // The run use case evaluates in the pool, which loads the evaluation bundle the build writes.
  if (!fs.existsSync(path.join(process.cwd(), "public", "evaluation", "manifest.json")))
    execFileSync(process.execPath, ["scripts/build-evaluation-bundle.mjs"], { stdio: "inherit" });
  const { loadBenchRuns } = await import("./lib/bench-audit-load");
  const { BENCH_SECTIONS, openBench } = await import("./lib/bench-audit-sections");
  const bench = await openBench({ appUrl: database.urls.app, ownerUrl: database.urls.owner });
  try {
    if (!database.kept) await loadBenchRuns(bench, runs);
    const unknown = only?.filter((id) => !BENCH_SECTIONS.some((section) => section.id === id)) ?? [];
    if (unknown.length)
      throw new Error(
        `--only names no section ${unknown.join(", ")}; the sections: ${BENCH_SECTIONS.map((s) => s.id).join(", ")}`,
      );
    for (const section of BENCH_SECTIONS.filter((s) => !only || only.includes(s.id))) {
      console.log(`\n== ${section.title}`);
      await section.run(bench);
    }
  } finally {
    await bench.close();
  }
}

main().then(
  async () => {
    await stop();
    process.exit(0);
  },
  async (error: unknown) => {
    console.error(error);
    await stop();
    process.exit(1);
  },
);
