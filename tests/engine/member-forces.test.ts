// memberForces is memberDiagram's N, V and M without the displacements (what a design check at each section
// reads): on random frames with every kind of load, release and support, it must give exactly the diagram's
// samples, extremes and values at any x, on both sides of a load's edge. Identity, not a tolerance: the same
// statics must run on the same numbers.
import { describe, expect, it } from "vitest";
import { memberDiagram, memberForces } from "@/lib/engine";
import { analyzeOrThrow, seededRandom } from "./helpers";
import { randomRichFrame } from "./random-rich-frames";

describe("memberForces", () => {
  it("equals memberDiagram's N, V and M on random rich frames, under load cases and combinations", () => {
    let compared = 0;
    for (let seed = 1; seed <= 12; seed++) {
      const result = analyzeOrThrow(randomRichFrame(seed, { maxStoreys: 3, maxBays: 3 }));
      const rand = seededRandom(seed * 7919);
      const ids = [...Object.keys(result.loadCases), ...Object.keys(result.combinations)];
      expect(ids.length).toBeGreaterThanOrEqual(1);
      for (const member of result.memberIds) {
        for (const id of ids) {
          const d = memberDiagram(result, member, id);
          const f = memberForces(result, member, id);
          expect(f.length).toBe(d.length);
          expect(f.samples.x).toEqual(d.samples.x);
          for (const q of ["N", "V", "M"] as const) {
            expect(f.samples[q]).toEqual(d.samples[q]);
            expect(f.extremes[q]).toEqual(d.extremes[q]);
          }
          for (const x of [0, d.length, rand() * d.length, ...d.samples.x])
            for (const side of ["left", "right"] as const) {
              const all = d.valueAt(x, side);
              expect(f.forcesAt(x, side)).toEqual({ N: all.N, V: all.V, M: all.M });
            }
          compared++;
        }
      }
    }
    expect(compared).toBeGreaterThan(100);
  });

  it("clamps x to the member and names an unknown member or result", () => {
    const result = analyzeOrThrow(randomRichFrame(3, { maxStoreys: 1, maxBays: 1 }));
    const member = result.memberIds[0];
    const id = Object.keys(result.loadCases)[0];
    const f = memberForces(result, member, id);
    expect(f.forcesAt(-1)).toEqual(f.forcesAt(0));
    expect(f.forcesAt(f.length + 1, "left")).toEqual(f.forcesAt(f.length, "left"));
    expect(() => memberForces(result, "no-such-member", id)).toThrow(/memberForces: no member "no-such-member"/);
    expect(() => memberForces(result, member, "no-such-case")).toThrow(/no load case or combination "no-such-case"/);
  });
});
