// Micro-benchmark of the sparse solver on frame stiffness matrices: npm run bench:sparse
// The matrices are the engine's own K of the regular frames of bench-engine.ts (through linearSystem).
import { linearSystem } from "../lib/engine";
import { factorizeSymmetric, multiplySymmetric, type OrderingMethod } from "../lib/engine/sparse";
import { regularFrame } from "./bench-engine";

function frameMatrix(storeys: number, bays: number) {
  const built = linearSystem(regularFrame(storeys, bays));
  if (!built.ok || !built.system.K) throw new Error("invalid benchmark frame");
  return { matrix: built.system.K, blockSize: built.system.blockSize };
}

const sizes: Array<[number, number]> = [
  [10, 10],
  [50, 50],
  [100, 100],
  [200, 100],
];
const methods: OrderingMethod[] = ["amd", "rcm"];
const repeats = 5;

const fmt = (v: number): string => v.toFixed(1).padStart(8);
console.log(
  ["size", "method", "n", "nnz(A)", "nnz(L)", "order", "symbolic", "numeric", "solve", "fact.cpu", "resid"]
    .map((s) => s.padStart(9))
    .join(""),
);
for (const [storeys, bays] of sizes) {
  const frame = frameMatrix(storeys, bays);
  const a = frame.matrix;
  const b = new Float64Array(a.n).map((_, i) => Math.sin(i + 1));
  for (const method of methods) {
    if (method === "rcm" && storeys * bays > 100 * 100) continue;
    // Best of several runs: the first pays for JIT warm-up.
    // Wall times suffer when other processes share the machine; the process CPU time of the whole
    // factorisation is printed too, as a steadier figure.
    let best = { order: Infinity, symbolic: Infinity, numeric: Infinity, solve: Infinity, cpu: Infinity };
    let nnzL = 0;
    let resid = 0;
    for (let r = 0; r < repeats; r++) {
      const cpu0 = process.cpuUsage();
      const result = factorizeSymmetric(a, { ordering: method, blockSize: frame.blockSize });
      const cpu = process.cpuUsage(cpu0);
      if (!result.ok) throw new Error(`factorisation failed at equation ${result.equation}`);
      const t0 = performance.now();
      const x = result.factor.solve(b);
      const solveMs = performance.now() - t0;
      const s = result.factor.stats;
      best = {
        order: Math.min(best.order, s.orderingMs),
        symbolic: Math.min(best.symbolic, s.symbolicMs),
        numeric: Math.min(best.numeric, s.numericMs),
        solve: Math.min(best.solve, solveMs),
        cpu: Math.min(best.cpu, (cpu.user + cpu.system) / 1000),
      };
      nnzL = s.nnzL;
      const ax = multiplySymmetric(a, x);
      let num = 0;
      let den = 0;
      for (let i = 0; i < a.n; i++) {
        num += (ax[i] - b[i]) ** 2;
        den += b[i] ** 2;
      }
      resid = Math.sqrt(num / den);
    }
    console.log(
      `${`${storeys}x${bays}`.padStart(9)}${method.padStart(9)}${String(a.n).padStart(9)}${String(a.colPtr[a.n]).padStart(9)}${String(nnzL).padStart(9)}` +
        `${fmt(best.order)} ${fmt(best.symbolic)} ${fmt(best.numeric)} ${fmt(best.solve)} ${fmt(best.cpu)} ${resid.toExponential(1).padStart(8)}`,
    );
  }
}
