/**
 * npm run bench:standards — for each starting standard: the time to compile a version (read, validate, check
 * names and expressions, evaluate at its defaults and at each choice to find dimension errors), and the time
 * to evaluate it with its default inputs, warm (median of many runs), and the multi-storey frame again at
 * 10 bays × 10 storeys. Target on the 2-core machine: every starting standard evaluates in under 10 ms, the
 * multi-storey frame at 10 × 10 under 30 ms. Run through scripts/run-bundled.mjs: bundled and minified as the
 * evaluation bundle is (the code the pool and the browser run), not through tsx.
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
  const runs: [string, Record<string, string | number>][] = [[file, {}]];
  if (file.startsWith("multi-storey-frame/")) runs.push([`${file} at 10 × 10`, { n_bays: 10, n_storeys: 10 }]);
  for (const [name, inputs] of runs) {
    for (let i = 0; i < 10; i++) standard!.evaluate(inputs);
    const evalTimes: number[] = [];
    for (let i = 0; i < 40; i++) {
      const t = performance.now();
      const out = standard!.evaluate(inputs);
      evalTimes.push(performance.now() - t);
      if (!out.ok) throw new Error(`${name}: ${JSON.stringify(out)}`);
    }
    console.log(
      name.padEnd(44),
      (name === file ? median(compileTimes.slice(1)).toFixed(1) : "").padStart(9),
      median(evalTimes).toFixed(2).padStart(9),
      Math.min(...evalTimes)
        .toFixed(2)
        .padStart(7),
    );
  }
}
