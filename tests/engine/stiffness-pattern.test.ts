import { describe, expect, it } from "vitest";
import type { ModelInput } from "@/lib/engine";
import { localStiffness, memberDofs, prepareMembers, rotationalStiffness } from "@/lib/engine/members";
import { assembleStiffness } from "@/lib/engine/stiffness";
import { buildDofMap } from "@/lib/engine/dofs";
import { toGlobalStiffness } from "@/lib/engine/elements";
import { SymmetricTripletBuilder, type SymmetricCsc } from "@/lib/engine/sparse";
import { validateModel } from "@/lib/engine/validate";
import { analyzeOrThrow, expectClose, seededRandom } from "./helpers";
import { randomFrame } from "./random-frames";
import { randomRichFrame } from "./random-rich-frames";

type Members = NonNullable<ModelInput["members"]>;

/**
 * The same frame with its members listed in a seeded random order, about a third of the unloaded ones drawn the
 * other way round, and the first and about a third of the others split into two parallel members of half the modulus each: the
 * second drawn the other way, with no density (self-weight) and no loads, listed at a random place. Stiffness is
 * linear in E, so K is the same matrix up to round-off; the fixed-end forces of a prismatic member do not depend
 * on E, so the loads are the same too.
 */
function shuffledWithParallels(model: ModelInput, seed: number): ModelInput {
  const rand = seededRandom(seed);
  const loaded = new Set(
    (model.loadCases ?? []).flatMap((c) => (c.loads ?? []).flatMap((l) => ("member" in l ? [l.member] : []))),
  );
  const out: Members = [];
  for (const [i, m] of (model.members ?? []).entries()) {
    const drawn = !loaded.has(m.id) && rand() < 0.35 ? { ...m, start: m.end, end: m.start, releases: flipped(m.releases) } : m;
    if (i === 0 || rand() < 0.35) {
      out.push({ ...drawn, E: m.E / 2 });
      const twin = {
        ...drawn,
        id: `${m.id}-twin`,
        E: m.E / 2,
        start: drawn.end,
        end: drawn.start,
        releases: flipped(drawn.releases),
      };
      delete twin.density;
      out.push(twin);
    } else out.push(drawn);
  }
  for (let i = out.length - 1; i > 0; i--) {
    const j = Math.floor(rand() * (i + 1));
    [out[i], out[j]] = [out[j], out[i]];
  }
  return { ...model, members: out };
}

function flipped(r: Members[number]["releases"]): Members[number]["releases"] {
  return r && { startMoment: r.endMoment, endMoment: r.startMoment };
}

/** K the plain way: every nonzero member entry and spring as a triplet, then sorted and summed. */
function tripletStiffness(model: ModelInput): { direct: SymmetricCsc; reference: SymmetricCsc } {
  const v = validateModel(model);
  if (!v.ok) throw new Error(JSON.stringify(v.errors));
  const members = prepareMembers(v);
  const dofs = buildDofMap(v.model, rotationalStiffness(v.model, members));
  const builder = new SymmetricTripletBuilder(dofs.nFree);
  const K = new Float64Array(36);
  for (const p of members) {
    toGlobalStiffness(localStiffness(p, new Float64Array(36)), p.frame.c, p.frame.s, K);
    const g = memberDofs(p);
    for (let a = 0; a < 6; a++) {
      for (let b = 0; b <= a; b++) {
        const ea = dofs.equation[g[a]];
        const eb = dofs.equation[g[b]];
        if (ea >= 0 && eb >= 0 && K[a * 6 + b] !== 0) builder.add(ea, eb, K[a * 6 + b]);
      }
    }
  }
  for (let e = 0; e < dofs.nFree; e++)
    if (dofs.spring[dofs.freeToGlobal[e]] !== 0) builder.add(e, e, dofs.spring[dofs.freeToGlobal[e]]);
  return { direct: assembleStiffness(members, dofs), reference: builder.toCsc() };
}

function expectSameMatrix(direct: SymmetricCsc, reference: SymmetricCsc): void {
  expect(direct.n).toBe(reference.n);
  expect(Array.from(direct.colPtr)).toEqual(Array.from(reference.colPtr));
  expect(Array.from(direct.rowIdx)).toEqual(Array.from(reference.rowIdx));
  const scale = Math.max(...Array.from(reference.values, Math.abs));
  reference.values.forEach((x, i) => expect(Math.abs(direct.values[i] - x)).toBeLessThanOrEqual(1e-14 * scale));
}

describe("direct CSC assembly of K", () => {
  it("gives the pattern and values of triplet assembly on random frames", () => {
    for (let seed = 1; seed <= 60; seed++) {
      const { direct, reference } = tripletStiffness(
        randomFrame(seed, { releases: seed % 2 === 0, unsupported: seed % 7 === 0 }),
      );
      expectSameMatrix(direct, reference);
    }
  });

  it("handles parallel members, members listed high node first, trusses, springs and restrained directions", () => {
    const model: ModelInput = {
      nodes: [
        { id: "A", x: 0, y: 0, support: { ux: "fixed", uy: "fixed", rz: { kind: "spring", stiffness: 5e6 } } },
        { id: "B", x: 4, y: 0, support: { uy: { kind: "spring", stiffness: 1e7 } } },
        { id: "C", x: 4, y: 3 },
        { id: "D", x: 0, y: 3, support: { ux: "fixed" } },
      ],
      members: [
        { id: "m1", start: "B", end: "A", E: 210e9, A: 1e-2, I: 1e-4 },
        { id: "m2", start: "A", end: "B", E: 70e9, A: 2e-3, I: 3e-5, releases: { startMoment: true } },
        { id: "m3", start: "C", end: "B", E: 210e9, A: 1e-2, I: 1e-4 },
        { id: "m4", start: "C", end: "D", E: 210e9, A: 1e-2, I: 1e-4 },
        { id: "m5", start: "A", end: "C", kind: "truss", E: 210e9, A: 5e-4 },
        { id: "m6", start: "D", end: "A", E: 210e9, A: 1e-2, I: 1e-4 },
      ],
    };
    const { direct, reference } = tripletStiffness(model);
    expectSameMatrix(direct, reference);
  });

  it("gives the triplet pattern for members in any order, drawn either way, with parallel members (random frames)", () => {
    for (let seed = 1; seed <= 40; seed++) {
      const base = randomFrame(seed, { releases: seed % 2 === 0 });
      const { direct, reference } = tripletStiffness(shuffledWithParallels(base, 1000 + seed));
      expectSameMatrix(direct, reference);
    }
  });
});

describe("member order and parallel members", () => {
  it("leave displacements and reactions unchanged (rich random frames; two halves of E in parallel are one member)", () => {
    // Stiffness k = E·(A/L, 12I/L³, …) is linear in E, so two parallel members with E/2 are the one member
    // (direct stiffness method, common practice); the solution may differ only by round-off.
    for (let seed = 1; seed <= 12; seed++) {
      const model = randomRichFrame(seed, { maxStoreys: 3, maxBays: 3 });
      const twin = shuffledWithParallels(model, 7000 + seed);
      expect(twin.members!.length).toBeGreaterThan(model.members!.length);
      const [a, b] = [analyzeOrThrow(model).loadCases.L, analyzeOrThrow(twin).loadCases.L];
      const scale = (v: Float64Array, rotations: boolean) =>
        Math.max(
          ...Array.from(v)
            .filter((_, i) => (i % 3 === 2) === rotations)
            .map(Math.abs),
        );
      for (const [x, y] of [
        [b.displacements, a.displacements],
        [b.reactions, a.reactions],
      ] as const) {
        const [tScale, rScale] = [scale(y, false), scale(y, true)];
        expect(tScale).toBeGreaterThan(0);
        y.forEach((v, i) => expectClose(x[i], v, 1e-9, i % 3 === 2 ? rScale + tScale : tScale));
      }
    }
  });
});
