// Running commands, child services and timed phases for scripts/start.mjs and scripts/test.mjs.
// Plain Node only: these run before `npm ci` on a fresh machine.
import { spawn, spawnSync } from "node:child_process";
import fs from "node:fs";
import net from "node:net";

export const isRoot = typeof process.getuid === "function" && process.getuid() === 0;

/** Prints one step of the set-up, prefixed so it stands apart from the children's output. */
export function say(message) {
  console.log(`[gusset] ${message}`);
}

export class SetupError extends Error {}

/** Runs a command to completion; throws SetupError with its output when it fails. */
export function run(command, args, { env, cwd, quiet = false, allowFailure = false } = {}) {
  const result = spawnSync(command, args, {
    cwd,
    env: env ?? process.env,
    stdio: quiet ? ["ignore", "pipe", "pipe"] : ["ignore", "inherit", "inherit"],
    encoding: "utf8",
    maxBuffer: 64 * 1024 * 1024,
  });
  if (result.error) throw new SetupError(`${command} could not run: ${result.error.message}`);
  if (result.status !== 0 && !allowFailure) {
    const output = quiet ? `\n${(result.stdout ?? "") + (result.stderr ?? "")}`.trimEnd() : "";
    throw new SetupError(`${command} ${args.join(" ")} failed (exit ${result.status ?? result.signal})${output}`);
  }
  return { status: result.status, stdout: result.stdout ?? "", stderr: result.stderr ?? "" };
}

/**
 * Like run() but without blocking the event loop, so signal handlers keep working during long steps and
 * independent steps can overlap. Resolves { status, stdout, stderr } (output captured only when quiet).
 */
export function runAsync(command, args, { env, cwd, quiet = false, allowFailure = false } = {}) {
  return new Promise((resolve, reject) => {
    const child = spawn(command, args, {
      cwd,
      env: env ?? process.env,
      stdio: quiet ? ["ignore", "pipe", "pipe"] : ["ignore", "inherit", "inherit"],
    });
    let stdout = "";
    let stderr = "";
    child.stdout?.on("data", (chunk) => (stdout += chunk));
    child.stderr?.on("data", (chunk) => (stderr += chunk));
    child.on("error", (error) => reject(new SetupError(`${command} could not run: ${error.message}`)));
    child.on("close", (code, signal) => {
      if (code === 0 || allowFailure) return resolve({ status: code, stdout, stderr });
      const output = quiet ? `\n${stdout}${stderr}`.trimEnd() : "";
      reject(new SetupError(`${command} ${args.join(" ")} failed (exit ${code ?? signal})${output}`));
    });
  });
}

/** Times one phase and remembers it for the closing summary. */
export function createTimer() {
  const phases = [];
  const startedAt = Date.now();
  return {
    async phase(name, work) {
      const t0 = Date.now();
      try {
        return await work();
      } finally {
        phases.push({ name, ms: Date.now() - t0 });
      }
    },
    summary() {
      const total = ((Date.now() - startedAt) / 1000).toFixed(1);
      const parts = phases.map((p) => `${p.name} ${(p.ms / 1000).toFixed(1)}s`);
      return `timings: ${parts.join(", ")}; total ${total}s`;
    },
  };
}

/** True when something accepts TCP connections on 127.0.0.1:port. */
export function portAnswers(port, timeoutMs = 500) {
  return new Promise((resolve) => {
    const socket = net.connect({ host: "127.0.0.1", port });
    const done = (answer) => {
      socket.destroy();
      resolve(answer);
    };
    socket.setTimeout(timeoutMs, () => done(false));
    socket.once("connect", () => done(true));
    socket.once("error", () => done(false));
  });
}

/** GET a URL on loopback; resolves { status, body } or null when nothing answers. */
export async function httpGet(url, timeoutMs = 2000) {
  try {
    const response = await fetch(url, { signal: AbortSignal.timeout(timeoutMs), redirect: "manual" });
    return { status: response.status, body: await response.text() };
  } catch {
    return null;
  }
}

/** The last lines of a log file, indented, for an error message. */
export function tailOf(file, lines = 12) {
  try {
    const text = fs.readFileSync(file, "utf8").trimEnd().split("\n").slice(-lines);
    return `\n  last lines of ${file}:\n${text.map((line) => `    ${line}`).join("\n")}`;
  } catch {
    return "";
  }
}

/** Polls check() until it is true; fails early when `child` exits, quoting the end of `logFile`. */
export async function waitFor(what, check, { timeoutMs = 60_000, intervalMs = 150, child, logFile } = {}) {
  const deadline = Date.now() + timeoutMs;
  const log = () => (logFile ? tailOf(logFile) : "");
  while (Date.now() < deadline) {
    if (child && child.exitCode !== null)
      throw new SetupError(`${what} exited (code ${child.exitCode}) before it was ready${log()}`);
    if (await check()) return;
    await new Promise((resolve) => setTimeout(resolve, intervalMs));
  }
  throw new SetupError(`${what} was not ready after ${timeoutMs / 1000}s${log()}`);
}

/** A pid is alive when it exists and is not a zombie (dead processes are reaped late in these sandboxes). */
export function pidAlive(pid) {
  if (!Number.isInteger(pid) || pid <= 0) return false;
  try {
    process.kill(pid, 0);
  } catch (error) {
    return error.code === "EPERM";
  }
  try {
    const stat = fs.readFileSync(`/proc/${pid}/stat`, "utf8");
    const state = stat.slice(stat.lastIndexOf(")") + 2).split(" ")[0];
    return state !== "Z" && state !== "X";
  } catch {
    return true; // no /proc: trust kill(0)
  }
}

export function cwdOf(pid) {
  try {
    return fs.realpathSync(`/proc/${pid}/cwd`);
  } catch {
    return "";
  }
}

export function commandLineOf(pid) {
  try {
    return fs.readFileSync(`/proc/${pid}/cmdline`, "utf8").split("\0").join(" ");
  } catch {
    return "";
  }
}

/**
 * Child services this invocation started, stopped in reverse order on exit.
 * Each entry: { name, stop: async () => void | false }.
 */
export function createServiceRegistry() {
  const services = [];
  return {
    add(name, stop) {
      services.push({ name, stop });
    },
    async stopAll() {
      while (services.length > 0) {
        const service = services.pop();
        try {
          // stop() returns false when it chose to leave the service running (and said why).
          if ((await service.stop()) !== false) say(`stopped ${service.name}`);
        } catch (error) {
          say(`could not stop ${service.name}: ${error.message}`);
        }
      }
    },
  };
}

/** Starts a long-running child with its output appended to a log file. */
export function spawnService(command, args, { env, cwd, logFile }) {
  const log = fs.openSync(logFile, "a");
  fs.writeSync(log, `\n--- ${new Date().toISOString()} ${command} ${args.join(" ")}\n`);
  const child = spawn(command, args, { cwd, env, stdio: ["ignore", log, log] });
  fs.closeSync(log);
  return child;
}

/** SIGTERM, then SIGKILL after graceMs; resolves once the child has exited. */
export function stopChild(child, graceMs = 5000) {
  return new Promise((resolve) => {
    if (child.exitCode !== null || child.signalCode !== null) return resolve();
    const timer = setTimeout(() => child.kill("SIGKILL"), graceMs);
    child.once("exit", () => {
      clearTimeout(timer);
      resolve();
    });
    child.kill("SIGTERM");
  });
}

/**
 * Runs steps side by side and waits for all of them, so a failure in one never leaves another still
 * starting a service after the clean-up; then throws the first failure.
 */
export async function allOrFirstError(steps) {
  const results = await Promise.allSettled(steps);
  const failure = results.find((r) => r.status === "rejected");
  if (failure) throw failure.reason;
  return results.map((r) => r.value);
}
