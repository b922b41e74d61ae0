/** The sparse factorisation used by the engine agrees with a dense Cholesky on random frames. */
import { describe, it, expect } from "vitest";
import fc from "fast-check";
import { validateModel } from "@/lib/engine/validate";
import { assembleStiffness, caseFixedEndForces, caseRhs, prepareMembers, rotationalStiffness } from "@/lib/engine/assembly";
import { buildDofMap } from "@/lib/engine/dofs";
import { resolveCaseLoads } from "@/lib/engine/loads";
import { factorizeSymmetric } from "@/lib/engine/sparse";
import { solveDense } from "@/lib/engine/solve-dense";
import { randomFrame } from "./random-frames";

describe("sparse solve", () => {
  it("matches the dense reference to 1e-10 relative", () => {
    fc.assert(
      fc.property(fc.integer({ min: 1, max: 2 ** 31 - 1 }), (seed) => {
        const v = validateModel(randomFrame(seed, { releases: true }));
        if (!v.ok) throw new Error("invalid random frame");
        const members = prepareMembers(v);
        const dofs = buildDofMap(v.model, rotationalStiffness(v.model, members));
        const K = assembleStiffness(members, dofs);
        const loads = resolveCaseLoads(v.model, 0, members.map((p) => p.frame), { node: v.nodeIndex, member: v.memberIndex });
        const f = caseRhs(members, dofs, loads, caseFixedEndForces(members, loads), null);
        const factored = factorizeSymmetric(K, { ordering: "amd", blockSize: dofs.blockSize });
        expect(factored.ok).toBe(true);
        if (!factored.ok) return;
        const sparse = factored.factor.solve(f);
        const dense = solveDense(K, f)!;
        const scale = Math.max(...Array.from(dense, Math.abs));
        dense.forEach((x, i) => expect(Math.abs(sparse[i] - x)).toBeLessThanOrEqual(1e-10 * scale));
      }),
      { numRuns: 20 },
    );
  });
});
