/**
 * npm run bench:standards — for each starting standard: the time to compile a version (read, validate, check
 * names and expressions, evaluate at its defaults and at each choice to find dimension errors), and the time
 * to evaluate it with its default inputs, warm (median of many runs). Target on the 2-core machine: every
 * starting standard evaluates in under 10 ms.
 */
import { cpus, loadavg } from "node:os";
import { compileStandard } from "../lib/standards";
import { startingStandardFiles } from "./lib/starting-standards";

function median(values: number[]): number {
  const s = [...values].sort((a, b) => a - b);
  return s[Math.floor(s.length / 2)];
}

console.log(`${cpus().length} cores, load ${loadavg()[0].toFixed(1)}; times in ms`);
console.log("standard".padEnd(44), "compile".padStart(9), "evaluate".padStart(9), "min".padStart(7));
for (const { file, source } of startingStandardFiles()) {
  // A new narrative comment each time, so the compile cache never answers.
  const compileTimes: number[] = [];
  let standard = null;
  for (let i = 0; i < 7; i++) {
    const t = performance.now();
    const out = compileStandard(`${source}\n{/* bench ${i} ${Date.now()} */}\n`);
    compileTimes.push(performance.now() - t);
    if (!out.ok) throw new Error(`${file}: ${JSON.stringify(out.problems)}`);
    standard = out.standard;
  }
  for (let i = 0; i < 20; i++) standard!.evaluate();
  const evalTimes: number[] = [];
  for (let i = 0; i < 60; i++) {
    const t = performance.now();
    const out = standard!.evaluate();
    evalTimes.push(performance.now() - t);
    if (!out.ok) throw new Error(`${file}: ${JSON.stringify(out)}`);
  }
  console.log(
    file.padEnd(44),
    median(compileTimes.slice(1)).toFixed(1).padStart(9),
    median(evalTimes).toFixed(2).padStart(9),
    Math.min(...evalTimes)
      .toFixed(2)
      .padStart(7),
  );
}
