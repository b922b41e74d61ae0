import { describe, expect, it } from "vitest";
import { SpanTable } from "@/lib/engine/loads";

describe("SpanTable", () => {
  it("behaves like a Map from member index to span loads: created once, iterated in first-loaded order", () => {
    const table = new SpanTable(6);
    expect(table.size).toBe(0);
    expect(table.get(3)).toBeUndefined();
    const a = table.of(4);
    a.concentrated.push({ axis: 2, a: 1, value: 5 });
    const b = table.of(1);
    expect(table.of(4)).toBe(a);
    expect(table.get(4)).toBe(a);
    expect(table.get(1)).toBe(b);
    expect(table.get(0)).toBeUndefined();
    expect(table.get(99)).toBeUndefined();
    expect(table.size).toBe(2);
    expect([...table.keys()]).toEqual([4, 1]);
    expect([...table]).toEqual([
      [4, a],
      [1, b],
    ]);
  });
});
