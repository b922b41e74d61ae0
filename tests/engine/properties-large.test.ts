/**
 * Properties of linear frame analysis on larger seeded random frames (up to 10 bays × 10 storeys) with every load
 * kind, beams released at one or both ends, truss diagonals, spring supports and settlements (randomRichFrame).
 * Unlike equilibrium of the engine's own load vector, the load resultant here is computed from the model alone,
 * so a load resolved into the wrong components or applied at the wrong place is seen.
 */
import { describe, it, expect } from "vitest";
import fc from "fast-check";
import { nodeDisplacement, nodeReaction, type LoadInput, type ModelInput } from "@/lib/engine";
import { analyzeOrThrow, expectClose, expectNear, runs, seededRandom } from "./helpers";
import { randomRichFrame } from "./random-rich-frames";
import { expectNodeAndMemberEquilibrium, loadResultant } from "./frame-checks";

const LARGE = { maxStoreys: 10, maxBays: 10 };
const RUNS = runs(20);
const seeds = fc.integer({ min: 1, max: 2 ** 31 - 1 });
const COMPONENT = { fx: "ux", fy: "uy", mz: "rz" } as const;
type Direction = keyof typeof COMPONENT;

/** A random node above the base and a direction, for a unit load. */
function pickLoadPoint(model: ModelInput, rand: () => number): { node: string; dir: Direction } {
  const free = model.nodes.filter((n) => !n.support);
  expect(free.length).toBeGreaterThan(0);
  return { node: free[Math.floor(rand() * free.length)].id, dir: (["fx", "fy", "mz"] as const)[Math.floor(rand() * 3)] };
}
const unitLoad = (p: { node: string; dir: Direction }): LoadInput => ({ kind: "nodal", node: p.node, [p.dir]: 1 });

describe("larger random frames: releases at both ends, truss diagonals, springs and settlements", () => {
  it("the reactions balance the applied loads as computed from the model alone (ΣFx, ΣFy, ΣM about the origin)", () => {
    fc.assert(
      fc.property(seeds, (seed) => {
        const model = randomRichFrame(seed, LARGE);
        const r = analyzeOrThrow(model);
        const applied = loadResultant(model, "L");
        let [fx, fy, mz, scaleM] = [0, 0, 0, 0];
        for (const n of model.nodes) {
          const R = nodeReaction(r, n.id, "L");
          fx += R.fx;
          fy += R.fy;
          mz += R.mz + n.x * R.fy - n.y * R.fx;
          scaleM += Math.abs(R.mz) + Math.abs(n.x * R.fy) + Math.abs(n.y * R.fx);
        }
        // Statics (common practice): reactions and applied loads form a system in equilibrium.
        expectNear(fx + applied.fx, 0, 1e-9 * applied.scaleF);
        expectNear(fy + applied.fy, 0, 1e-9 * applied.scaleF);
        expectNear(mz + applied.mz, 0, 1e-9 * (applied.scaleM + scaleM));
      }),
      RUNS,
    );
  });

  it("every node and every member is in equilibrium, with a solver residual near rounding", () => {
    fc.assert(
      fc.property(seeds, (seed) => {
        const model = randomRichFrame(seed, LARGE);
        const r = analyzeOrThrow(model);
        expect(r.loadCases.L.equilibrium.relative).toBeLessThan(1e-10);
        expect(r.loadCases.L.relativeResidual).toBeLessThan(1e-10);
        expectNodeAndMemberEquilibrium(model, r, "L");
      }),
      runs(10),
    );
  });

  it("Maxwell–Betti: the displacement at b from a unit load at a equals that at a from a unit load at b", () => {
    fc.assert(
      fc.property(seeds, (seed) => {
        const rand = seededRandom(seed ^ 0x5bd1e995);
        const base = randomRichFrame(seed, LARGE);
        const [a, b] = [pickLoadPoint(base, rand), pickLoadPoint(base, rand)];
        // Settlements are bound to case "L", which stays (empty); in "a" and "b" those supports act as fixed.
        const r = analyzeOrThrow({
          ...base,
          loadCases: [
            { id: "L", loads: [] },
            { id: "a", loads: [unitLoad(a)] },
            { id: "b", loads: [unitLoad(b)] },
          ],
        });
        const dba = nodeDisplacement(r, b.node, "a")[COMPONENT[b.dir]];
        const dab = nodeDisplacement(r, a.node, "b")[COMPONENT[a.dir]];
        const own =
          Math.abs(nodeDisplacement(r, a.node, "a")[COMPONENT[a.dir]]) +
          Math.abs(nodeDisplacement(r, b.node, "b")[COMPONENT[b.dir]]);
        expect(own).toBeGreaterThan(0);
        expectClose(dba, dab, 1e-8, 1e-6 * own);
      }),
      RUNS,
    );
  });

  it("Betti with a settlement: the displacement at a from a settlement δ of support s is −δ × (reaction at s from a unit load at a)", () => {
    // Betti's reciprocal theorem (common practice): the unit load and the reactions of the loaded case do work on the
    // settlement case's displacements, 1·u_a + R_s·δ; the settlement case has no loads, and its reactions do no work on
    // the loaded case, whose supports do not move (spring work is internal and cancels). So u_a = −δ·R_s.
    fc.assert(
      fc.property(seeds, (seed) => {
        const rand = seededRandom(seed ^ 0x27d4eb2d);
        const base = randomRichFrame(seed, LARGE);
        const bases = base.nodes.filter((n) => n.support && n.id !== "N0_0");
        expect(bases.length).toBeGreaterThan(0);
        const s = bases[Math.floor(rand() * bases.length)];
        const delta = -(0.002 + 0.02 * rand());
        const nodes = base.nodes.map((n) =>
          n === s ? { ...n, support: { ux: "fixed", uy: { kind: "prescribed", value: delta, loadCase: "S" }, rz: "fixed" } } : n,
        ) as ModelInput["nodes"];
        const a = pickLoadPoint(base, rand);
        const r = analyzeOrThrow({
          ...base,
          nodes,
          loadCases: [
            { id: "L", loads: [] },
            { id: "S", loads: [] },
            { id: "a", loads: [unitLoad(a)] },
          ],
        });
        expectClose(nodeDisplacement(r, s.id, "S").uy, delta);
        const uS = nodeDisplacement(r, a.node, "S")[COMPONENT[a.dir]];
        const Rs = nodeReaction(r, s.id, "a").fy;
        const scale = Math.abs(delta) * r.loadCases.a.reactions.reduce((t, v) => t + Math.abs(v), 0);
        expect(scale).toBeGreaterThan(0);
        expectClose(uS, -delta * Rs, 1e-8, 1e-6 * scale);
        expect(r.loadCases.S.equilibrium.relative).toBeLessThan(1e-10);
      }),
      RUNS,
    );
  });
});
