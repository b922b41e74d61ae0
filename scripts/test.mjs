// `npm test`: the same set-up as `npm start` against a fresh `gusset_test` database and the test ports,
// then `vitest run` (unit, integration, browser) with extra arguments passed through. Stops what it
// started and exits with vitest's code.
//   npm test                        everything
//   npm test -- tests/engine        a subset; when every path given is under tests/unit or tests/engine
//   npm test -- --project unit      (or only unit projects are named) no services are started
import { spawn } from "node:child_process";
import fs from "node:fs";
import os from "node:os";
import path from "node:path";
import { authSecret, childEnv, gussetEnv, repoRoot } from "./lib/env.mjs";
import { ensureBuild } from "./lib/build.mjs";
import { migrate, seed } from "./lib/database.mjs";
import { ensureFakeS3, ensureFakeSmtp } from "./lib/fakes.mjs";
import { CHROMIUM_PACKAGE, POSTGRES_PACKAGE, ensureDebianPackages, ensureNodeModules } from "./lib/install.mjs";
import { createLifecycle, profileSetup } from "./lib/lifecycle.mjs";
import { ensurePostgres, recreateDatabase } from "./lib/postgres.mjs";
import { say } from "./lib/processes.mjs";
import { checkServerPort, startServer, stopServerByPid } from "./lib/server.mjs";

const vitestArgs = process.argv.slice(2);
const { timer, registry, shutdown, main } = createLifecycle({ signalExitCode: 130 });

/** True when the arguments ask only for unit tests, which need no database, fakes or server. */
function onlyUnitTests(args) {
  const projects = [];
  const paths = [];
  for (let i = 0; i < args.length; i++) {
    const arg = args[i];
    if (arg === "--project") projects.push(args[++i]);
    else if (arg.startsWith("--project=")) projects.push(arg.slice("--project=".length));
    else if (!arg.startsWith("-")) paths.push(arg);
  }
  if (projects.length > 0 && projects.every((p) => p === "unit")) return true;
  return paths.length > 0 && paths.every((p) => /^(\.\/)?tests\/(unit|engine)(\/|$)/.test(p));
}

async function prepareServices(env) {
  const { ports, layout, database } = profileSetup("test");
  await timer.phase("system packages", () => ensureDebianPackages([POSTGRES_PACKAGE, CHROMIUM_PACKAGE]));
  await timer.phase("postgres", async () => {
    const postgres = await ensurePostgres({ layout, port: ports.postgres, fast: true });
    if (postgres.started) registry.add("PostgreSQL", postgres.stop);
    recreateDatabase(ports.postgres, database);
  });
  await timer.phase("migrate", () => migrate(env));
  await timer.phase("seed", () => seed(env));
  await timer.phase("fakes", async () => {
    await ensureFakeSmtp({ ports, layout, profile: "test", registry });
    await ensureFakeS3({ ports, layout, profile: "test", registry, bucket: env.S3_BUCKET });
  });
  await timer.phase("build", () => ensureBuild({ env, layout }));
  await timer.phase("server", async () => {
    const stale = await checkServerPort(layout, ports.app);
    if (stale !== null) {
      say(`stopping a test server left by an earlier run (pid ${stale})`);
      await stopServerByPid(stale);
    }
    await startServer({ env, layout, port: ports.app, profile: "test", registry });
  });
}

/** Runs vitest; resolves its exit code. Adds a JSON report so we can print one closing count line. */
function runVitest(env, reportFile) {
  const ownReporter = vitestArgs.some((a) => a.startsWith("--reporter") || a.startsWith("--outputFile"));
  const reportArgs = ownReporter ? [] : ["--reporter=default", "--reporter=json", `--outputFile.json=${reportFile}`];
  const vitest = path.join(repoRoot, "node_modules", ".bin", "vitest");
  return new Promise((resolve) => {
    const child = spawn(vitest, ["run", ...reportArgs, ...vitestArgs], { cwd: repoRoot, env, stdio: "inherit" });
    child.on("exit", (code, signal) => resolve(code ?? (signal ? 1 : 0)));
  });
}

/** The closing count line, last so CI reads it; null when vitest wrote no report. */
function countsLine(reportFile) {
  if (!fs.existsSync(reportFile)) return null;
  const report = JSON.parse(fs.readFileSync(reportFile, "utf8"));
  fs.rmSync(reportFile, { force: true });
  const failedFiles = (report.testResults ?? []).filter((f) => f.status === "failed" && f.assertionResults?.length === 0);
  for (const file of failedFiles) say(`${path.relative(repoRoot, file.name)} failed before running its tests: ${file.message ?? ""}`);
  const skipped = (report.numPendingTests ?? 0) + (report.numTodoTests ?? 0);
  return `vitest: ${report.numPassedTests} passed, ${report.numFailedTests} failed, ${skipped} skipped`;
}

await main(async () => {
  await timer.phase("npm dependencies", ensureNodeModules);
  const env = childEnv(gussetEnv("test", { secret: authSecret().secret }));
  if (onlyUnitTests(vitestArgs)) say("only unit tests asked for: no database, fakes or server started");
  else await prepareServices(env);

  const reportFile = path.join(os.tmpdir(), `gusset-vitest-${process.pid}.json`);
  const code = await timer.phase("vitest", () => runVitest(env, reportFile));
  const counts = countsLine(reportFile);
  await registry.stopAll();
  say(timer.summary());
  if (counts) console.log(counts);
  await shutdown(code);
});
