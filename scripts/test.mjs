// `npm test`: the same set-up as `npm start` against a fresh `gusset_test` database and the test ports,
// then `vitest run` (unit, integration, browser) with extra arguments passed through. Stops what it
// started and exits with vitest's code.
//   npm test                        everything
//   npm test -- tests/engine        a subset; when every path given is under tests/unit, tests/engine or tests/standards
//   npm test -- --project unit      (or only unit projects are named) no services are started
import { spawn } from "node:child_process";
import fs from "node:fs";
import os from "node:os";
import path from "node:path";
import { authSecret, childEnv, databaseUrlFor, gussetEnv, migrationEnv, portsFor, repoRoot } from "./lib/env.mjs";
import { buildStaleness, ensureBuild } from "./lib/build.mjs";
import { readBuildId } from "./lib/build-id.mjs";
import { CHROMIUM_PACKAGE, POPPLER_PACKAGE, POSTGRES_PACKAGE, ensureDebianPackages, ensureNodeModules } from "./lib/install.mjs";
import { createLifecycle, profileSetup } from "./lib/lifecycle.mjs";
import { say } from "./lib/processes.mjs";
import { checkServerPort, runningServerPid, startServer, stopServerByPid } from "./lib/server.mjs";
import { prepareServices } from "./lib/services.mjs";

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
  return paths.length > 0 && paths.every((p) => /^(\.\/)?tests\/(unit|engine|standards)(\/|$)/.test(p));
}

async function prepareEverything(env) {
  const setup = profileSetup("test");
  const { ports, layout } = setup;
  await timer.phase("system packages", () => ensureDebianPackages([POSTGRES_PACKAGE, CHROMIUM_PACKAGE, POPPLER_PACKAGE]));
  const stale = await checkServerPort(layout, ports.app); // fail early when a stranger holds the port
  if (stale !== null) {
    say(`stopping a test server left by an earlier run (pid ${stale})`);
    await stopServerByPid(stale);
  }
  await prepareServices({ setup, env, registry, timer, fresh: true });
  await timer.phase("build", () => {
    if (buildStaleness() !== null && runningServerPid(layout, portsFor("start").app) !== null) {
      say("warning: rebuilding .next while `npm start` serves from it; restart `npm start` afterwards");
    }
    return ensureBuild({ env, layout });
  });
  await timer.phase("server", () => startServer({ env, layout, port: ports.app, profile: "test", registry }));
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
  for (const file of failedFiles)
    say(`${path.relative(repoRoot, file.name)} failed before running its tests: ${file.message ?? ""}`);
  const skipped = (report.numPendingTests ?? 0) + (report.numTodoTests ?? 0);
  const failed = report.numFailedTests + failedFiles.length; // a file that cannot load counts as one failure
  return `vitest: ${report.numPassedTests} passed, ${failed} failed, ${skipped} skipped`;
}

await main(async () => {
  await timer.phase("npm dependencies", ensureNodeModules);
  const env = childEnv(gussetEnv("test", { secret: authSecret().secret }));
  if (onlyUnitTests(vitestArgs)) say("only unit tests asked for: no database, fakes or server started");
  else await prepareEverything(env);

  // The tests' own code runs as the app's role (DATABASE_URL) like the server and the worker; the owner's
  // and the superuser's URLs are for fixtures only: scratch databases, migrations, the owner's view.
  const testEnv = { ...env, ...migrationEnv("test"), DATABASE_ADMIN_URL: databaseUrlFor("test", "superuser", "postgres") };
  // The build the test server serves (scripts/serve.mjs sets the same there): route handlers called in-process
  // compute a calc sheet's key for that build.
  const buildId = readBuildId(repoRoot);
  if (buildId) testEnv.GUSSET_BUILD_ID = buildId;
  const reportFile = path.join(os.tmpdir(), `gusset-vitest-${process.pid}.json`);
  const code = await timer.phase("vitest", () => runVitest(testEnv, reportFile));
  const counts = countsLine(reportFile);
  await registry.stopAll();
  say(timer.summary());
  if (counts) console.log(counts);
  await shutdown(code);
});
