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
