// The background worker (scripts/worker.ts) as a child of `npm start` / `npm test`, started once the
// database is migrated (the queue schema comes with the migrations).
import fs from "node:fs";
import path from "node:path";
import { repoRoot } from "./env.mjs";
import { say, spawnService, stopChild, waitFor } from "./processes.mjs";

const tsx = path.join(repoRoot, "node_modules", ".bin", "tsx");
const READY = "[gusset-worker] working on";

export async function startWorkerProcess({ env, layout, profile, registry }) {
  const logFile = path.join(layout.logs, `worker-${profile}.log`);
  const from = fs.existsSync(logFile) ? fs.statSync(logFile).size : 0;
  const child = spawnService(tsx, ["--conditions=react-server", "scripts/worker.ts", "--parent-pid", String(process.pid)], {
    cwd: repoRoot,
    env,
    logFile,
  });
  registry.add("the worker", () => stopChild(child, 12_000));
  const readySince = () => fs.readFileSync(logFile, "utf8").slice(from).includes(READY);
  await waitFor("the background worker", readySince, { child, logFile, timeoutMs: 30_000, intervalMs: 100 });
  const shownLog = path.relative(repoRoot, logFile).startsWith("..") ? logFile : path.relative(repoRoot, logFile);
  say(`background worker running (log: ${shownLog})`);
  return child;
}
