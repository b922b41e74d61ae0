// What start.mjs and test.mjs share: timed phases, the services this invocation started, and a clean
// stop on Ctrl-C, SIGTERM or a failed step (only what this invocation started is stopped).
import fs from "node:fs";
import { databaseFor, portsFor, resolveStateDir, stateLayout } from "./env.mjs";
import { SetupError, createServiceRegistry, createTimer, isRoot, say } from "./processes.mjs";

/** `signalExitCode`: 0 for `npm start` (Ctrl-C is how it ends), 130 for `npm test` (interrupted). */
export function createLifecycle({ signalExitCode = 0 } = {}) {
  const timer = createTimer();
  const registry = createServiceRegistry();
  let shuttingDown = false;

  async function shutdown(code) {
    if (shuttingDown) return;
    shuttingDown = true;
    await registry.stopAll();
    process.exit(code);
  }

  for (const signal of ["SIGINT", "SIGTERM"]) {
    process.on(signal, () => {
      if (!shuttingDown) say(`${signal}: stopping what this run started`);
      void shutdown(signalExitCode);
    });
  }

  /** Runs the script body; a failed step prints its reason, stops our services and exits 1. */
  async function main(body) {
    try {
      await body();
    } catch (error) {
      if (shuttingDown) return; // a child interrupted by Ctrl-C: the signal handler is stopping things
      if (error instanceof SetupError) say(`error: ${error.message}`);
      else console.error(error);
      await shutdown(1);
    }
  }

  return { timer, registry, shutdown, main, isShuttingDown: () => shuttingDown };
}

/** Ports, database name and state folders for a profile ("start" or "test"). */
export function profileSetup(profile) {
  const { dir, fallback } = resolveStateDir({ asRoot: isRoot });
  const layout = stateLayout(dir);
  for (const folder of [layout.root, layout.logs, layout.run]) fs.mkdirSync(folder, { recursive: true });
  if (isRoot) fs.chmodSync(layout.root, 0o755); // the postgres user must traverse it
  if (fallback) {
    say(`a parent folder of this checkout is closed to the postgres user: local state lives in ${dir}`);
  }
  return { profile, ports: portsFor(profile), database: databaseFor(profile), layout };
}
