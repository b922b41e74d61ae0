// The production server (scripts/serve.mjs: Next behind node:http, see there why) on loopback, with a pid
// file so a second run knows it is ours.
import fs from "node:fs";
import path from "node:path";
import { repoRoot } from "./env.mjs";
import {
  SetupError,
  commandLineOf,
  cwdOf,
  httpGet,
  pidAlive,
  portAnswers,
  say,
  spawnService,
  stopChild,
  waitFor,
} from "./processes.mjs";

function pidFileFor(layout, port) {
  return path.join(layout.run, `next-${port}.pid`);
}

/** The pid of our server on this port when one runs, else null. */
export function runningServerPid(layout, port) {
  const pidFile = pidFileFor(layout, port);
  if (!fs.existsSync(pidFile)) return null;
  const pid = Number.parseInt(fs.readFileSync(pidFile, "utf8"), 10);
  if (pidAlive(pid) && commandLineOf(pid).includes("serve.mjs") && cwdOf(pid) === fs.realpathSync(repoRoot)) return pid;
  fs.rmSync(pidFile, { force: true });
  return null;
}

/** Checks the port before we start: throws when a stranger holds it. Returns our pid when ours does. */
export async function checkServerPort(layout, port) {
  const ours = runningServerPid(layout, port);
  if (ours !== null) return ours;
  if (await portAnswers(port)) {
    throw new SetupError(`port ${port} is busy with another program (not a Gusset server started from this checkout)`);
  }
  return null;
}

export async function stopServerByPid(pid) {
  process.kill(pid, "SIGTERM");
  await waitFor(`server pid ${pid} to stop`, () => !pidAlive(pid), { timeoutMs: 15_000 });
}

export async function startServer({ env, layout, port, profile, registry }) {
  const logFile = path.join(layout.logs, `next-${profile}.log`);
  const child = spawnService(
    process.execPath,
    [path.join(repoRoot, "scripts", "serve.mjs"), "--hostname", "127.0.0.1", "--port", String(port)],
    { cwd: repoRoot, env, logFile },
  );
  const pidFile = pidFileFor(layout, port);
  fs.writeFileSync(pidFile, String(child.pid));
  registry.add("the Next server", async () => {
    await stopChild(child, 8000);
    fs.rmSync(pidFile, { force: true });
  });
  const url = `http://127.0.0.1:${port}`;
  await waitFor("the Next server", async () => (await httpGet(url, 5000)) !== null, {
    child,
    logFile,
    timeoutMs: 90_000,
    intervalMs: 200,
  });
  const shownLog = path.relative(repoRoot, logFile).startsWith("..") ? logFile : path.relative(repoRoot, logFile);
  say(`Next server answers on ${url} (log: ${shownLog})`);
  return child;
}
