// The CPU a process and each of its threads has used, read from Linux's /proc, for the benchmarks that split a
// server's CPU by thread (bench-runs.ts, bench-pool-alone.ts).
import { execFileSync } from "node:child_process";
import fs from "node:fs";

/** The name the evaluation pool's workers give their threads (lib/evaluation/entry.ts). */
export const EVALUATION_THREAD_NAME = "gusset-eval";

let ticksPerSecond: number | undefined;
/** utime + stime of a /proc stat line, in seconds. */
function cpuOfStat(stat: string): number {
  ticksPerSecond ??= Number(execFileSync("getconf", ["CLK_TCK"], { encoding: "utf8" }).trim());
  const fields = stat.split(") ")[1].split(" ");
  return (Number(fields[11]) + Number(fields[12])) / ticksPerSecond;
}

/** CPU seconds the process has used, all its threads. */
export function processCpuSeconds(pid: number): number {
  return cpuOfStat(fs.readFileSync(`/proc/${pid}/stat`, "utf8"));
}

/**
 * The CPU seconds used by the processes whose command line matches `pattern` and by their children (PostgreSQL's
 * postmaster and its backends, say), as a reading to subtract from a later one. Processes that end in between are
 * lost from the later reading, so the difference is a floor.
 */
export function processTreeCpuSeconds(pattern: RegExp): number {
  const stats = new Map<number, { ppid: number; cpu: number; cmdline: string }>();
  for (const entry of fs.readdirSync("/proc")) {
    if (!/^\d+$/.test(entry)) continue;
    try {
      const stat = fs.readFileSync(`/proc/${entry}/stat`, "utf8");
      const ppid = Number(stat.slice(stat.lastIndexOf(")") + 2).split(" ")[1]);
      const cmdline = fs.readFileSync(`/proc/${entry}/cmdline`, "utf8").replaceAll("\0", " ");
      stats.set(Number(entry), { ppid, cpu: cpuOfStat(stat), cmdline });
    } catch {
      // the process ended between the listing and the read
    }
  }
  const roots = new Set([...stats].filter(([, { cmdline }]) => pattern.test(cmdline)).map(([pid]) => pid));
  let total = 0;
  for (const [pid, { ppid, cpu }] of stats) if (roots.has(pid) || roots.has(ppid)) total += cpu;
  return total;
}

export type ThreadCpu = { cpu: number; name: string };

/** Each thread of the process by id: its name (as `top -H` shows it) and the CPU seconds it has used. */
export function threadCpu(pid: number): Map<number, ThreadCpu> {
  const threads = new Map<number, ThreadCpu>();
  for (const tid of fs.readdirSync(`/proc/${pid}/task`)) {
    try {
      const cpu = cpuOfStat(fs.readFileSync(`/proc/${pid}/task/${tid}/stat`, "utf8"));
      threads.set(Number(tid), { cpu, name: fs.readFileSync(`/proc/${pid}/task/${tid}/comm`, "utf8").trim() });
    } catch {
      // the thread ended between the listing and the read
    }
  }
  return threads;
}

/** What each thread used between two readings (a thread started in between counts from zero), with its name. */
export function threadDeltas(before: Map<number, ThreadCpu>, after: Map<number, ThreadCpu>): Map<number, ThreadCpu> {
  return new Map([...after].map(([tid, { cpu, name }]) => [tid, { cpu: cpu - (before.get(tid)?.cpu ?? 0), name }]));
}

/** CPU seconds by role: the process's main thread, the evaluation pool's workers, and the rest (V8's and libuv's helpers). */
export type CpuByRole = { main: number; evaluation: number; evaluationThreads: number; helpers: number };

/**
 * Splits what a process's threads used (threadDeltas) by role. The evaluation's threads are those named
 * EVALUATION_THREAD_NAME, unless `evaluates` tells them otherwise (a server of an older build leaves them unnamed).
 */
export function cpuByRole(
  deltas: Map<number, ThreadCpu>,
  mainPid: number,
  evaluates: (tid: number, thread: ThreadCpu) => boolean = (_tid, thread) => thread.name === EVALUATION_THREAD_NAME,
): CpuByRole {
  const split: CpuByRole = { main: 0, evaluation: 0, evaluationThreads: 0, helpers: 0 };
  for (const [tid, thread] of deltas) {
    if (tid === mainPid) split.main += thread.cpu;
    else if (evaluates(tid, thread)) {
      split.evaluation += thread.cpu;
      split.evaluationThreads += 1;
    } else split.helpers += thread.cpu;
  }
  return split;
}
