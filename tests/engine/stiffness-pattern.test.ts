import { describe, expect, it } from "vitest";
import type { ModelInput } from "@/lib/engine";
import { localStiffness, memberDofs, prepareMembers, rotationalStiffness } from "@/lib/engine/members";
import { assembleStiffness } from "@/lib/engine/stiffness";
import { buildDofMap } from "@/lib/engine/dofs";
import { toGlobalStiffness } from "@/lib/engine/elements";
import { SymmetricTripletBuilder, type SymmetricCsc } from "@/lib/engine/sparse";
import { validateModel } from "@/lib/engine/validate";
import { randomFrame } from "./random-frames";

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
});
