/** Properties every linear frame analysis must have, checked on seeded random frames (fast-check drives the seeds). */
import { describe, it, expect } from "vitest";
import fc from "fast-check";
import { memberDiagram, nodeDisplacement, memberEndForces, type LoadInput, type ModelInput } from "@/lib/engine";
import { validateModel } from "@/lib/engine/validate";
import { prepareMembers, rotationalStiffness } from "@/lib/engine/members";
import { assembleStiffness } from "@/lib/engine/stiffness";
import { buildDofMap } from "@/lib/engine/dofs";
import { condense, frameLocalStiffness, toGlobalStiffness } from "@/lib/engine/elements";
import { multiplySymmetric } from "@/lib/engine/sparse";
import { analyzeOrThrow, expectClose, runs, seededRandom } from "./helpers";
import { randomFrame } from "./random-frames";
import { randomRichFrame } from "./random-rich-frames";
import { expectNodeAndMemberEquilibrium, splitEveryMember } from "./frame-checks";

const RUNS = runs(25);
const seeds = fc.integer({ min: 1, max: 2 ** 31 - 1 });

function stiffnessOf(model: ModelInput) {
  const v = validateModel(model);
  if (!v.ok) throw new Error(JSON.stringify(v.errors));
  const members = prepareMembers(v);
  const dofs = buildDofMap(v.model, rotationalStiffness(v.model, members));
  return { model: v.model, dofs, K: assembleStiffness(members, dofs) };
}

describe("element stiffness", () => {
  it("is symmetric and has the three rigid-body motions as null space, for any angle and releases", () => {
    fc.assert(
      fc.property(
        fc.double({ min: 0, max: 2 * Math.PI, noNaN: true }),
        fc.constantFrom([], [2], [5], [2, 5]),
        (angle, released) => {
          const L = 3.7;
          const c = Math.cos(angle);
          const s = Math.sin(angle);
          const K = toGlobalStiffness(condense(frameLocalStiffness(210e9, 0.01, 2e-4, L), null, [...released]).k, c, s);
          const scale = Math.max(...Array.from(K, Math.abs));
          for (let i = 0; i < 6; i++) for (let j = 0; j < i; j++) expectClose(K[i * 6 + j], K[j * 6 + i], 1e-12, scale);
          // Translations in X, Y and a rotation about node i (ux = −θ·y, uy = θ·x, rz = θ).
          const motions = [
            [1, 0, 0, 1, 0, 0],
            [0, 1, 0, 0, 1, 0],
            [0, 0, 1, -s * L, c * L, 1],
          ];
          for (const r of motions) {
            for (let i = 0; i < 6; i++) {
              const f = r.reduce((sum, rj, j) => sum + K[i * 6 + j] * rj, 0);
              expect(Math.abs(f)).toBeLessThan(1e-9 * scale * L);
            }
          }
        },
      ),
      runs(50),
    );
  });
});

describe("random frames", () => {
  it("an unsupported structure's rigid-body motions produce no force (K r = 0)", () => {
    fc.assert(
      fc.property(seeds, (seed) => {
        const { model, dofs, K } = stiffnessOf(randomFrame(seed, { unsupported: true, releases: true }));
        const absK = { ...K, values: K.values.map(Math.abs) };
        for (const [a, b, theta] of [
          [1e-3, 0, 0],
          [0, 1e-3, 0],
          [0, 0, 1e-4],
        ]) {
          const r = new Float64Array(dofs.nFree);
          for (let e = 0; e < dofs.nFree; e++) {
            const g = dofs.freeToGlobal[e];
            const node = model.nodes[Math.floor(g / 3)];
            r[e] = [a - theta * node.y, b + theta * node.x, theta][g % 3];
          }
          const Kr = multiplySymmetric(K, r);
          const scale = multiplySymmetric(absK, r.map(Math.abs));
          Kr.forEach((f, i) => expect(Math.abs(f)).toBeLessThanOrEqual(1e-10 * Math.max(...scale) + 1e-12 * scale[i]));
        }
      }),
      RUNS,
    );
  });

  it("Maxwell–Betti: the displacement at b from a unit load at a equals that at a from a unit load at b", () => {
    fc.assert(
      fc.property(seeds, (seed) => {
        const rand = seededRandom(seed ^ 0x5bd1e995);
        const base = randomFrame(seed, { releases: true });
        const free = base.nodes.filter((n) => !n.support);
        expect(free.length).toBeGreaterThan(0);
        const pick = () => ({
          node: free[Math.floor(rand() * free.length)].id,
          dir: (["fx", "fy", "mz"] as const)[Math.floor(rand() * 3)],
        });
        const a = pick();
        const b = pick();
        const unit = (p: typeof a): LoadInput => ({ kind: "nodal", node: p.node, [p.dir]: 1 });
        const r = analyzeOrThrow({
          ...base,
          loadCases: [
            { id: "a", loads: [unit(a)] },
            { id: "b", loads: [unit(b)] },
          ],
        });
        const comp = { fx: "ux", fy: "uy", mz: "rz" } as const;
        const dba = nodeDisplacement(r, b.node, "a")[comp[b.dir]];
        const dab = nodeDisplacement(r, a.node, "b")[comp[a.dir]];
        expectClose(dba, dab, 1e-8, 1e-14);
      }),
      RUNS,
    );
  });

  it("every node and every member is in equilibrium, and the whole structure too", () => {
    fc.assert(
      fc.property(seeds, (seed) => {
        const model = randomFrame(seed, { releases: true });
        const r = analyzeOrThrow(model);
        expect(r.loadCases.L.equilibrium.relative).toBeLessThan(1e-10);
        expect(r.loadCases.L.relativeResidual).toBeLessThan(1e-10);
        expectNodeAndMemberEquilibrium(model, r, "L");
      }),
      RUNS,
    );
  });

  it("results are unchanged when every member, and every load on it, is split in two (frames up to 10 × 10)", () => {
    fc.assert(
      fc.property(seeds, (seed) => {
        // Every load kind, releases at one or both ends, truss diagonals, springs and settlements (randomRichFrame).
        const model = randomRichFrame(seed, { maxStoreys: 10, maxBays: 10 });
        const { model: split, splitAt } = splitEveryMember(model, seed);
        const [a, b] = [analyzeOrThrow(model), analyzeOrThrow(split)];
        const [r1, r2] = [a.loadCases.L, b.loadCases.L];
        // The original nodes come first in both models, so their entries line up.
        const n = 3 * model.nodes.length;
        const largest = (v: ArrayLike<number>, rotations: boolean) =>
          Math.max(
            ...Array.from(v)
              .filter((_, i) => i < n && (i % 3 === 2) === rotations)
              .map(Math.abs),
          );
        const [uScale, rzScale] = [largest(r1.displacements, false), largest(r1.displacements, true)];
        const [fScale, mScale] = [largest(r1.reactions, false), largest(r1.reactions, true)];
        expect(uScale).toBeGreaterThan(0);
        expect(fScale).toBeGreaterThan(0);
        for (let i = 0; i < n; i++) {
          const rotation = i % 3 === 2;
          expectClose(r2.displacements[i], r1.displacements[i], 1e-8, rotation ? rzScale : uScale);
          expectClose(r2.reactions[i], r1.reactions[i], 1e-8, rotation ? mScale + fScale : fScale);
        }
        const members = model.members ?? [];
        expect(members.length).toBeGreaterThan(0);
        for (const m of members) {
          const f1 = memberEndForces(a, m.id, "L");
          const first = memberEndForces(b, `${m.id}a`, "L").start;
          const second = memberEndForces(b, `${m.id}b`, "L").end;
          const scale =
            Math.abs(f1.start.fx) + Math.abs(f1.start.fy) + Math.abs(f1.end.fy) + Math.abs(f1.start.mz) + Math.abs(f1.end.mz) + 1;
          for (const [x, y] of [
            [first, f1.start],
            [second, f1.end],
          ] as const) {
            expectClose(x.fx, y.fx, 1e-8, scale);
            expectClose(x.fy, y.fy, 1e-8, scale);
            expectClose(x.mz, y.mz, 1e-8, scale);
          }
          // Along the member: at the cut, the first half's end is the original's section there.
          const cut = splitAt.get(m.id)!;
          const whole = memberDiagram(a, m.id, "L");
          const half = memberDiagram(b, `${m.id}a`, "L").valueAt(cut, "left");
          const there = whole.valueAt(cut, "left");
          expectClose(half.M, there.M, 1e-8, scale * whole.length);
          expectClose(half.N, there.N, 1e-8, scale);
          expectClose(half.deflection, there.deflection, 1e-7, uScale);
        }
      }),
      runs(15),
    );
  });
});
