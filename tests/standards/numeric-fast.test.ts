// The closures that run a check's expressions at every section (lib/standards/numeric-fast.ts) must give exactly
// what mathjs gives — the same bits — wherever they give anything, and leave to mathjs whatever they do not
// mirror. Random expressions of the allowed forms, on random values chosen to hit mathjs's edge cases: zeros,
// negatives under roots and logs, nearly equal operands of comparisons, min and max.
import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { compileStandard } from "@/lib/standards";
import { compileNumeric } from "@/lib/standards/expressions";
import { SECTION_NAMES } from "@/lib/standards/checks";
import { startingStandardFiles } from "@/scripts/lib/starting-standards";

const NAMES = ["a", "b", "c"] as const;
const known = new Set<string>(NAMES);

const leaf = fc.oneof(fc.constantFrom(...NAMES), fc.constantFrom("0", "1", "2", "0.2", "0.5", "8 / 9", "pi", "3.5e-3", "1e6"));
const expression: fc.Arbitrary<string> = fc.letrec<{ e: string }>((tie) => ({
  e: fc.oneof(
    { depthSize: "small", withCrossShrink: true },
    leaf,
    fc.tuple(tie("e"), fc.constantFrom("+", "-", "*", "/", "^"), tie("e")).map(([x, op, y]) => `(${x} ${op} ${y})`),
    tie("e").map((x) => `-(${x})`),
    fc
      .tuple(fc.constantFrom("abs", "sqrt", "exp", "log", "log10", "sin", "cos", "tan", "atan", "asin", "acos"), tie("e"))
      .map(([f, x]) => `${f}(${x})`),
    fc.tuple(fc.constantFrom("min", "max", "atan2"), tie("e"), tie("e")).map(([f, x, y]) => `${f}(${x}, ${y})`),
    fc
      .tuple(tie("e"), fc.constantFrom("<", "<=", ">", ">=", "==", "!="), tie("e"), tie("e"), tie("e"))
      .map(([x, rel, y, p, q]) => `(${x} ${rel} ${y} ? ${p} : ${q})`),
    fc
      .tuple(tie("e"), tie("e"), fc.constantFrom("and", "or"), tie("e"), tie("e"), tie("e"))
      .map(([x, y, op, z, p, q]) => `(${x} > ${y} ${op} not (${z} < 1) ? ${p} : ${q})`),
  ),
})).e;

const value = fc.oneof(
  fc.double({ min: -1e6, max: 1e6, noNaN: true }),
  fc.constantFrom(0, -0, 1, -1, 0.2, 0.2 + 1e-14, 0.2 - 1e-14, 1e-15, 2.5e-16),
);

describe("numbers through closures, as mathjs computes them", () => {
  it("give mathjs's own result, bit for bit, wherever they give one", () => {
    let answered = 0;
    fc.assert(
      fc.property(
        expression.filter((source) => source.length <= 400),
        value,
        value,
        value,
        (source, a, b, c) => {
          const compiled = compileNumeric(source, known);
          const scope = new Map<string, number>([
            ["a", a],
            ["b", b],
            ["c", c],
          ]);
          const fast = compiled.evaluateNumber(scope);
          if (fast === null) return;
          answered++;
          expect(Object.is(fast, compiled.evaluate(scope)), `${source} at a=${a}, b=${b}, c=${c}`).toBe(true);
        },
      ),
      { numRuns: 4000, seed: 20261202 },
    );
    expect(answered).toBeGreaterThan(1500);
  }, 120_000);

  it("answer at the edges of mathjs's comparisons (relative tolerance 1e-12) as mathjs does", () => {
    for (const [a, b] of [
      [0.2, 0.2 + 1e-14],
      [0.2, 0.2 - 1e-14],
      [0.2, 0.2 + 1e-9],
      [1e-16, 0],
      [-0, 0],
    ]) {
      for (const source of [
        "a >= b ? 1 : 2",
        "a > b ? 1 : 2",
        "a < b ? 1 : 2",
        "a <= b ? 1 : 2",
        "a == b ? 1 : 2",
        "min(a, b)",
        "max(a, b)",
      ]) {
        const compiled = compileNumeric(source, known);
        const scope = new Map([
          ["a", a],
          ["b", b],
          ["c", 0],
        ]);
        expect(compiled.evaluateNumber(scope), `${source} at a=${a}, b=${b}`).toBe(compiled.evaluate(scope));
      }
    }
  });

  it("leave to mathjs what they do not mirror: conditions as results, texts, floor, cbrt, hypot, complex results", () => {
    const scope = new Map<string, number | string>([
      ["a", -4],
      ["b", 2],
      ["c", 0],
    ]);
    for (const source of ["a > b", "floor(a / 3)", "cbrt(a)", "hypot(a, b)", "sqrt(a)", "log(a)", "a / c", "a ^ 0.5"])
      expect(compileNumeric(source, known).evaluateNumber(scope), source).toBeNull();
    expect(
      compileNumeric("a + b", known).evaluateNumber(
        new Map<string, number | string>([
          ["a", "fixed"],
          ["b", 1],
        ]),
      ),
    ).toBeNull();
  });

  it("run every starting standard's checks for each member", () => {
    let checked = 0;
    for (const { file, source } of startingStandardFiles()) {
      const out = compileStandard(source);
      if (!out.ok) throw new Error(file);
      for (const check of Object.values(out.standard.definition.checks)) {
        if (!check.for_each) continue;
        const names = new Set([
          ...Object.keys(out.standard.definition.inputs),
          ...Object.keys(out.standard.definition.derived),
          ...Object.keys(out.standard.definition.extracts),
          ...SECTION_NAMES,
        ]);
        for (const side of [check.demand, check.capacity]) {
          const compiled = compileNumeric(side, names);
          const scope = new Map(compiled.names.map((name) => [name, 1.5] as [string, number]));
          expect(compiled.evaluateNumber(scope), `${file}: ${side}`).not.toBeNull();
          checked++;
        }
      }
    }
    expect(checked).toBeGreaterThanOrEqual(4);
  });
});
