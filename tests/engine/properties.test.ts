/** Properties every linear frame analysis must have, checked on seeded random frames (fast-check drives the seeds). */
import { describe, it, expect } from "vitest";
import fc from "fast-check";
import { memberDiagram, nodeDisplacement, memberEndForces, type LoadInput, type ModelInput } from "@/lib/engine";
import { validateModel } from "@/lib/engine/validate";
import { assembleStiffness, prepareMembers, rotationalStiffness } from "@/lib/engine/assembly";
import { buildDofMap } from "@/lib/engine/dofs";
import { condense, frameLocalStiffness, toGlobalStiffness } from "@/lib/engine/elements";
import { multiplySymmetric } from "@/lib/engine/sparse";
import { analyzeOrThrow, expectClose, expectNear, seededRandom } from "./helpers";
import { randomFrame } from "./random-frames";

const RUNS = { numRuns: 25 };
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
      fc.property(fc.double({ min: 0, max: 2 * Math.PI, noNaN: true }), fc.constantFrom([], [2], [5], [2, 5]), (angle, released) => {
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
      }),
      { numRuns: 50 },
    );
  });
});

describe("random frames", () => {
  it("an unsupported structure's rigid-body motions produce no force (K r = 0)", () => {
    fc.assert(
      fc.property(seeds, (seed) => {
        const { model, dofs, K } = stiffnessOf(randomFrame(seed, { unsupported: true, releases: true }));
        const absK = { ...K, values: K.values.map(Math.abs) };
        for (const [a, b, theta] of [[1e-3, 0, 0], [0, 1e-3, 0], [0, 0, 1e-4]]) {
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
        const pick = () => ({ node: free[Math.floor(rand() * free.length)].id, dir: (["fx", "fy", "mz"] as const)[Math.floor(rand() * 3)] });
        const a = pick();
        const b = pick();
        const unit = (p: typeof a): LoadInput => ({ kind: "nodal", node: p.node, [p.dir]: 1 });
        const r = analyzeOrThrow({ ...base, loadCases: [{ id: "a", loads: [unit(a)] }, { id: "b", loads: [unit(b)] }] });
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
        const res = r.loadCases.L;
        expect(res.equilibrium.relative).toBeLessThan(1e-10);
        expect(res.relativeResidual).toBeLessThan(1e-10);
        // Nodes: Σ (member end forces, global) − nodal loads − reactions = 0.
        const sum = new Float64Array(3 * model.nodes.length);
        const scale = new Float64Array(sum.length);
        const nodeIndex = new Map(model.nodes.map((n, i) => [n.id, i]));
        for (const m of model.members ?? []) {
          const f = memberEndForces(r, m.id, "L");
          const [a, b] = [model.nodes[nodeIndex.get(m.start)!], model.nodes[nodeIndex.get(m.end)!]];
          const L = Math.hypot(b.x - a.x, b.y - a.y);
          const c = (b.x - a.x) / L;
          const s = (b.y - a.y) / L;
          for (const [node, end] of [[m.start, f.start], [m.end, f.end]] as const) {
            const o = 3 * nodeIndex.get(node)!;
            const F = [c * end.fx - s * end.fy, s * end.fx + c * end.fy, end.mz];
            F.forEach((v, d) => {
              sum[o + d] += v;
              scale[o + d] += Math.abs(v);
            });
          }
          // Member: the diagram, integrated from the start with the span loads, must land on the end forces at L.
          const d = memberDiagram(r, m.id, "L");
          const atEnd = d.valueAt(L, "left");
          const tol = 1e-8 * (Math.abs(f.start.fy) + Math.abs(f.end.fy) + Math.abs(f.start.fx) + 1);
          expectNear(atEnd.N, f.end.fx, tol);
          expectNear(atEnd.V, -f.end.fy, tol);
          expectNear(atEnd.M, f.end.mz, tol * L);
        }
        for (const load of model.loadCases![0].loads!) {
          if (load.kind !== "nodal") continue;
          const o = 3 * nodeIndex.get(load.node)!;
          [load.fx ?? 0, load.fy ?? 0, load.mz ?? 0].forEach((v, d) => (sum[o + d] -= v));
        }
        sum.forEach((v, i) => {
          const residual = v - res.reactions[i];
          expect(Math.abs(residual)).toBeLessThanOrEqual(1e-9 * (scale[i] + Math.abs(res.reactions[i])) + 1e-6);
        });
      }),
      RUNS,
    );
  });

  it("results are unchanged when every member is split in two", () => {
    fc.assert(
      fc.property(seeds, (seed) => {
        const model = randomFrame(seed, { releases: true, simpleLoads: true });
        const split = splitEveryMember(model);
        const r1 = analyzeOrThrow(model);
        const r2 = analyzeOrThrow(split);
        for (const n of model.nodes) {
          const d1 = nodeDisplacement(r1, n.id, "L");
          const d2 = nodeDisplacement(r2, n.id, "L");
          const scale = Math.max(Math.abs(d1.ux), Math.abs(d1.uy)) + 1e-12;
          expectClose(d2.ux, d1.ux, 1e-8, scale);
          expectClose(d2.uy, d1.uy, 1e-8, scale);
          expectClose(d2.rz, d1.rz, 1e-8, scale / 3);
        }
        for (const m of model.members ?? []) {
          const f1 = memberEndForces(r1, m.id, "L");
          const a = memberEndForces(r2, `${m.id}a`, "L").start;
          const b = memberEndForces(r2, `${m.id}b`, "L").end;
          const scale = Math.abs(f1.start.fx) + Math.abs(f1.start.fy) + Math.abs(f1.start.mz) + 1;
          expectClose(a.fy, f1.start.fy, 1e-8, scale);
          expectClose(a.mz, f1.start.mz, 1e-8, scale);
          expectClose(b.mz, f1.end.mz, 1e-8, scale);
          // Midspan of the original member = end of its first half.
          const L = memberDiagram(r1, m.id, "L").length;
          expectClose(memberDiagram(r2, `${m.id}a`, "L").valueAt(L / 2, "left").M, memberDiagram(r1, m.id, "L").valueAt(L / 2).M, 1e-8, scale);
          expectClose(memberDiagram(r2, `${m.id}b`, "L").valueAt(L / 4).deflection, memberDiagram(r1, m.id, "L").valueAt((3 * L) / 4).deflection, 1e-7, 1e-9);
        }
      }),
      RUNS,
    );
  });
});

/** Each member becomes `<id>a` and `<id>b` meeting at a new midpoint node; full-length loads are split too. */
function splitEveryMember(model: ModelInput): ModelInput {
  const nodes = [...model.nodes];
  const members: NonNullable<ModelInput["members"]> = [];
  const byId = new Map(model.nodes.map((n) => [n.id, n]));
  for (const m of model.members ?? []) {
    const a = byId.get(m.start)!;
    const b = byId.get(m.end)!;
    nodes.push({ id: `${m.id}-mid`, x: (a.x + b.x) / 2, y: (a.y + b.y) / 2 });
    const { releases, ...rest } = m;
    members.push({ ...rest, id: `${m.id}a`, end: `${m.id}-mid`, ...(releases?.startMoment ? { releases: { startMoment: true } } : {}) });
    members.push({ ...rest, id: `${m.id}b`, start: `${m.id}-mid`, ...(releases?.endMoment ? { releases: { endMoment: true } } : {}) });
  }
  const loads = model.loadCases![0].loads!.flatMap((l): LoadInput[] => {
    if (l.kind !== "distributed") return [l];
    return [{ ...l, member: `${l.member}a` }, { ...l, member: `${l.member}b` }];
  });
  return { ...model, nodes, members, loadCases: [{ id: "L", loads }] };
}
