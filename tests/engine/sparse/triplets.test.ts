import { describe, expect, it } from "vitest";
import { SymmetricTripletBuilder } from "@/lib/engine/sparse";
import { createRandom, findCscViolation, toDense } from "./dense-reference";

describe("SymmetricTripletBuilder", () => {
  it("sums duplicates and mirrors upper-triangle entries into the lower triangle", () => {
    const builder = new SymmetricTripletBuilder(3, 2);
    builder.add(0, 0, 1);
    builder.add(0, 0, 2);
    builder.add(0, 2, 5); // upper: stored as (2, 0)
    builder.add(2, 0, 1);
    builder.add(1, 1, 4);
    builder.add(2, 1, -1);
    builder.add(2, 2, 7);
    const a = builder.toCsc();
    expect(findCscViolation(a)).toBeNull();
    expect(Array.from(a.colPtr)).toEqual([0, 2, 4, 5]);
    expect(Array.from(a.rowIdx)).toEqual([0, 2, 1, 2, 2]);
    expect(Array.from(a.values)).toEqual([3, 6, 4, -1, 7]);
  });

  it("produces sorted, duplicate-free columns from random input in any order", () => {
    const random = createRandom(7);
    const n = 40;
    const expected = Array.from({ length: n }, () => new Array<number>(n).fill(0));
    const builder = new SymmetricTripletBuilder(n); // default capacity forces growth
    for (let t = 0; t < 2000; t++) {
      const i = Math.floor(random() * n);
      const j = Math.floor(random() * n);
      const v = Math.round(random() * 100) - 50;
      builder.add(i, j, v);
      expected[Math.max(i, j)][Math.min(i, j)] += v;
    }
    const a = builder.toCsc();
    expect(findCscViolation(a)).toBeNull();
    const dense = toDense(a);
    for (let i = 0; i < n; i++) {
      for (let j = 0; j <= i; j++) expect(dense[i][j]).toBe(expected[i][j]);
    }
  });

  it("handles an empty matrix and rejects out-of-range indices", () => {
    const empty = new SymmetricTripletBuilder(4).toCsc();
    expect(Array.from(empty.colPtr)).toEqual([0, 0, 0, 0, 0]);
    const builder = new SymmetricTripletBuilder(2);
    expect(() => builder.add(2, 0, 1)).toThrow(/out of range/);
    expect(() => builder.add(-1, 0, 1)).toThrow(/out of range/);
    expect(() => builder.add(0.5, 0, 1)).toThrow(/out of range/);
    // The column index is checked the same way.
    expect(() => builder.add(0, 2, 1)).toThrow("SymmetricTripletBuilder.add: index (0, 2) out of range for n = 2");
    expect(() => builder.add(0, -1, 1)).toThrow(/out of range/);
    expect(() => builder.add(1, 0.5, 1)).toThrow(/out of range/);
    expect(builder.size).toBe(0);
  });

  it("counts every triplet added, duplicates included, and refuses a size that is not a whole number ≥ 0", () => {
    const builder = new SymmetricTripletBuilder(3);
    builder.add(0, 0, 1);
    builder.add(1, 0, 2);
    builder.add(0, 1, 3);
    expect(builder.size).toBe(3);
    expect(builder.toCsc().values.length).toBe(2);
    expect(() => new SymmetricTripletBuilder(-1)).toThrow("SymmetricTripletBuilder: invalid size -1");
    expect(() => new SymmetricTripletBuilder(2.5)).toThrow("SymmetricTripletBuilder: invalid size 2.5");
  });
});
