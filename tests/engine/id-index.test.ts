import { describe, expect, it } from "vitest";
import { IdIndex } from "@/lib/engine/id-index";
import { seededRandom } from "./helpers";

function randomIds(seed: number, count: number): { id: string }[] {
  const rand = seededRandom(seed);
  // A small alphabet and short ids give plenty of duplicates.
  return Array.from({ length: count }, () => ({
    id: Array.from({ length: 1 + Math.floor(rand() * 3) }, () => "abcN_1é"[Math.floor(rand() * 7)]).join(""),
  }));
}

function expectLikeMap(index: IdIndex, items: { id: string }[]): void {
  const map = new Map(items.map((item, i) => [item.id, i]));
  expect(index.size).toBe(map.size);
  for (const id of [...map.keys(), "", "missing", "zz", "N"]) {
    expect(index.get(id)).toBe(map.get(id));
    expect(index.has(id)).toBe(map.has(id));
  }
}

describe("IdIndex", () => {
  it("answers like a Map (last duplicate wins, missing ids undefined) for random ids", () => {
    for (let seed = 1; seed <= 30; seed++) {
      const items = randomIds(seed, Math.floor(seededRandom(seed)() * 400));
      expectLikeMap(new IdIndex(items), items);
    }
    expectLikeMap(new IdIndex([]), []);
  });

  it("stays correct when every id collides, and falls back to a Map on long probe runs", () => {
    const few = randomIds(7, 30);
    expectLikeMap(new IdIndex(few, () => 5), few);
    const many = Array.from({ length: 500 }, (_, i) => ({ id: `M${i % 300}` }));
    expectLikeMap(new IdIndex(many, () => 0), many);
  });
});
