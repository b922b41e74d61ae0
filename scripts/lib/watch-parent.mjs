// A fake service started by scripts/start.mjs or scripts/test.mjs exits when that script is gone, so a
// killed set-up script never leaves a fake holding its port.
import { pidAlive } from "./processes.mjs";

export function exitWithParent(parentPid, onExit) {
  if (!parentPid) return;
  const timer = setInterval(() => {
    if (!pidAlive(parentPid)) onExit();
  }, 1000);
  timer.unref();
}

/** Stops on SIGINT/SIGTERM by calling close(), then exits 0. */
export function exitOnSignals(close) {
  let closing = false;
  const stop = async () => {
    if (closing) return;
    closing = true;
    const force = setTimeout(() => process.exit(0), 3000);
    force.unref();
    try {
      await close();
    } finally {
      process.exit(0);
    }
  };
  process.on("SIGINT", stop);
  process.on("SIGTERM", stop);
  return stop;
}
