/** The sparse factorisation used by the engine agrees with a dense Cholesky on random frames. */
import { describe, it, expect } from "vitest";
import fc from "fast-check";
import { linearSystem, type ModelInput } from "@/lib/engine";
import { factorizeSymmetric } from "@/lib/engine/sparse";
import { solveDense, toDense } from "./sparse/dense-reference";
import { randomFrame } from "./random-frames";
import { runs } from "./helpers";

/** A Pratt truss of `panels` panels pinned at both ends: every free node keeps exactly ux and uy. */
function prattTruss(panels: number): ModelInput {
  const nodes: ModelInput["nodes"] = [];
  const members: NonNullable<ModelInput["members"]> = [];
  for (let i = 0; i <= panels; i++) {
    nodes.push({ id: `B${i}`, x: 3 * i, y: 0, ...(i === 0 || i === panels ? { support: { ux: "fixed", uy: "fixed" } } : {}) });
    nodes.push({ id: `T${i}`, x: 3 * i, y: 2.5 });
  }
  const bar = (id: string, start: string, end: string) => members.push({ id, start, end, kind: "truss", E: 200e9, A: 1.5e-3 });
  for (let i = 0; i < panels; i++) {
    bar(`b${i}`, `B${i}`, `B${i + 1}`);
    bar(`t${i}`, `T${i}`, `T${i + 1}`);
    bar(`d${i}`, i < panels / 2 ? `T${i}` : `B${i}`, i < panels / 2 ? `B${i + 1}` : `T${i + 1}`);
  }
  for (let i = 0; i <= panels; i++) bar(`v${i}`, `B${i}`, `T${i}`);
  const loads = Array.from({ length: panels - 1 }, (_, i) => ({
    kind: "nodal" as const,
    node: `B${i + 1}`,
    fy: -20e3,
    fx: 1e3 * i,
  }));
  return { nodes, members, loadCases: [{ id: "L", loads }] };
}

function compareWithDense(model: ModelInput, expectedBlockSize?: number) {
  // The equations exactly as analyze assembles them (the engine's own first stages).
  const built = linearSystem(model);
  if (!built.ok || !built.system.K) throw new Error("invalid model");
  const { K, rhs, blockSize } = built.system;
  if (expectedBlockSize !== undefined) expect(blockSize).toBe(expectedBlockSize);
  const f = rhs[0];
  const factored = factorizeSymmetric(K, { ordering: "amd", blockSize });
  expect(factored.ok).toBe(true);
  if (!factored.ok) return;
  const sparse = factored.factor.solve(f);
  const dense = solveDense(toDense(K), f);
  const scale = Math.max(...Array.from(dense, Math.abs));
  dense.forEach((x, i) => expect(Math.abs(sparse[i] - x)).toBeLessThanOrEqual(1e-10 * scale));
}

describe("sparse solve", () => {
  it("matches the dense reference on a pin-jointed truss (two equations per node)", () => {
    compareWithDense(prattTruss(8), 2);
  });

  it("matches the dense reference to 1e-10 relative", () => {
    fc.assert(
      fc.property(fc.integer({ min: 1, max: 2 ** 31 - 1 }), (seed) => {
        compareWithDense(randomFrame(seed, { releases: true }));
      }),
      runs(20),
    );
  });
});
