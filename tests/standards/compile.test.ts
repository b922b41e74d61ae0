/**
 * A draft is refused when saved if its definition is malformed, a name shadows a unit, an expression is not
 * an allowed form, or a dimension is wrong anywhere it can be evaluated — each refusal with the path, line and
 * column of what to fix.
 */
import { describe, expect, it } from "vitest";
import { compileStandard } from "@/lib/standards";
import { checkExpression, ExpressionError } from "@/lib/standards/expressions";
import { runVerification } from "@/lib/standards/verify";
import { beamDefinition, compileOrThrow, problemsOf, sourceOf } from "./helpers";

type Def = ReturnType<typeof beamDefinition> & Record<string, any>; // eslint-disable-line @typescript-eslint/no-explicit-any

function withChange(change: (d: Def) => void): string {
  const d = beamDefinition() as Def;
  change(d);
  return sourceOf(d);
}

describe("the file's shape", () => {
  it("a file that does not start with --- is refused at line 1", () => {
    expect(problemsOf("title: x\n")).toEqual([
      { path: "", line: 1, column: 1, message: "The file must start with a line `---`, then the definition in YAML" },
    ]);
  });

  it("a definition that is never closed is refused", () => {
    expect(problemsOf("---\ntitle: x\n")[0].message).toMatch(/^The definition is not closed/);
  });

  it("YAML errors carry the file's line (the --- line counts)", () => {
    const problems = problemsOf("---\ntitle: x\ninputs: [a\n---\n");
    expect(problems[0]).toMatchObject({ message: expect.stringMatching(/^YAML: /) });
    expect(problems[0].line).toBeGreaterThanOrEqual(3);
  });

  it("a duplicate key is a YAML error, not a silent overwrite", () => {
    expect(problemsOf("---\ntitle: a\ntitle: b\n---\n")[0].message).toMatch(/^YAML: .*unique/i);
  });

  it("an unknown field is refused at its line", () => {
    const source = withChange((d) => (d.inputs.L.colour = "red"));
    const line = source.split("\n").findIndex((l) => l.includes("colour")) + 1;
    const column = source.split("\n")[line - 1].indexOf("red") + 1;
    expect(problemsOf(source)).toEqual([{ path: "inputs.L.colour", line, column, message: "unknown field `colour`" }]);
  });

  it("a missing field names its path", () => {
    const problems = problemsOf(withChange((d) => delete d.summary));
    expect(problems).toEqual([expect.objectContaining({ path: "summary" })]);
  });
});

describe("names", () => {
  it("an input named like a unit is refused, so `5 N` can never mean 5 × an input", () => {
    const problems = problemsOf(withChange((d) => (d.inputs.N = { label: "Count", quantity: "dimensionless", default: 3 })));
    expect(problems).toEqual([
      expect.objectContaining({ path: "inputs.N", message: expect.stringMatching(/^`N` is the name of a unit/) }),
    ]);
  });

  it.each(["m", "kN", "ft", "kip", "MPa", "sqrt", "pi", "e"])("`%s` may not name an input", (name) => {
    const problems = problemsOf(withChange((d) => (d.inputs[name] = { label: "x", quantity: "dimensionless", default: 1 })));
    expect(problems[0].path).toBe(`inputs.${name}`);
  });

  it("a derived value may not reuse an input's name, nor the names kept for member checks", () => {
    expect(problemsOf(withChange((d) => (d.derived.L = { expr: "1 m", quantity: "length", unit: "m" })))[0].message).toMatch(
      /already used by inputs.L/,
    );
    expect(
      problemsOf(withChange((d) => (d.derived.M = { expr: "1 kN m", quantity: "moment", unit: "kN m" })))[0].message,
    ).toMatch(/kept for the section's forces/);
  });

  it("an unknown name in an expression is refused, never read as some unit (`h` is an hour in mathjs)", () => {
    const problems = problemsOf(withChange((d) => (d.derived.k2 = { expr: "2 * h", quantity: "length", unit: "m" })));
    expect(problems).toEqual([expect.objectContaining({ path: "derived.k2.expr", message: "unknown name `h` in `2 * h`" })]);
  });
});

describe("expressions: only allowed forms run", () => {
  const refuse = (source: string) => {
    try {
      checkExpression(source, new Set(["L", "w"]));
    } catch (error) {
      if (error instanceof ExpressionError) return error.reason;
      throw error;
    }
    return null;
  };
  it.each([
    ["import({x: 1}, {override: true})", "the function `import` is not allowed"],
    ["createUnit('foo')", "the function `createUnit` is not allowed"],
    ["evaluate('1 + 1')", "the function `evaluate` is not allowed"],
    ["parse('x')", "the function `parse` is not allowed"],
    ["config({number: 'BigNumber'})", "the function `config` is not allowed"],
    ["ones(3000, 3000)", "the function `ones` is not allowed"],
    ["1:5e6", "a range is not allowed"],
    ["[1, 2, 3]", "a list or matrix is not allowed"],
    ["f(x) = x^2", "a function definition is not allowed"],
    ["L = 3", "an assignment is not allowed"],
    ["L.valueOf", "property access or indexing is not allowed"],
    ["L to ft", "the operator `to` is not allowed"],
    ["L; w", "several statements is not allowed"],
    ["sqrt(L, w)", "`sqrt` takes 1 argument"],
  ])("%s", (source, reason) => {
    expect(refuse(source)).toBe(reason);
  });

  it("a very long expression is refused before it is parsed", () => {
    expect(refuse("1 + ".repeat(200) + "1")).toBe("an expression may be at most 400 characters");
  });

  it("arithmetic, units, comparisons, conditions and allowed functions pass", () => {
    for (const source of [
      "w * L^2 / 8",
      "1.2 w + 1.6 kN/m",
      "L > 5 m ? sqrt(L / 1 m) : max(1, 2)",
      "abs(-w) <= 3 kip/ft",
      "cos(30 deg)",
    ])
      expect(refuse(source)).toBeNull();
  });
});

describe("dimensions are checked when the draft is saved", () => {
  it("a derived value adding a force to a length", () => {
    const source = withChange((d) => (d.derived.bad = { expr: "w * L + L", quantity: "force", unit: "kN" }));
    const problems = problemsOf(source);
    const line = source.split("\n").findIndex((l) => l.includes("expr: w * L + L")) + 1;
    expect(problems).toEqual([
      {
        path: "derived.bad.expr",
        line,
        column: source.split("\n")[line - 1].indexOf("w * L") + 1,
        message: expect.stringMatching(/^the units do not match .* in `w \* L \+ L` \(with the default inputs\)$/),
      },
    ]);
  });

  it("a derived value whose result is not the quantity it declares", () => {
    const problems = problemsOf(withChange((d) => (d.derived.M_cap = { expr: "300 kN", quantity: "moment", unit: "kN m" })));
    expect(problems[0]).toMatchObject({
      path: "derived.M_cap.expr",
      message: expect.stringMatching(/^`300 kN` gives a force \(N\), but `M_cap` is declared a moment/),
    });
  });

  it("a capacity in another unit than its demand", () => {
    const problems = problemsOf(withChange((d) => (d.checks.bending.capacity = "300 kN")));
    expect(problems[0]).toMatchObject({
      path: "checks.bending",
      message: expect.stringMatching(/^the demand is a moment \(N m\) but the capacity is a force \(N\)/),
    });
  });

  it("an engine field fed the wrong quantity: E given in kN", () => {
    const problems = problemsOf(
      withChange((d) => (d.inputs.E = { label: "E", quantity: "force", unit: "kN", default: "200 kN" })),
    );
    expect(problems[0]).toMatchObject({
      path: "model.members[0].E",
      message: expect.stringMatching(/^`E` gives a force \(N\); a stress is needed here/),
    });
  });

  it("a coordinate written without its unit", () => {
    const problems = problemsOf(withChange((d) => (d.model.nodes[1].x = 6)));
    expect(problems[0]).toMatchObject({
      path: "model.nodes[1].x",
      message: expect.stringMatching(/a length is needed here \(add its unit\)/),
    });
  });

  it("an input whose unit is not of its quantity, or unknown", () => {
    expect(problemsOf(withChange((d) => (d.inputs.L.unit = "kN")))[0]).toMatchObject({
      path: "inputs.L.unit",
      message: "`kN` is not a unit of length",
    });
    expect(problemsOf(withChange((d) => (d.inputs.L.unit = "furlong")))[0]).toMatchObject({
      path: "inputs.L.unit",
      message: "`furlong` is not a unit Gusset knows",
    });
  });

  it("every branch of a choice is tried, not only the default", () => {
    const source = withChange((d) => {
      d.inputs.ends = { label: "Ends", quantity: "choice", choices: ["pinned", "fixed"], default: "pinned" };
      d.model.nodes[0].support = { ux: "fixed", uy: "fixed", rz: { if: "ends == 'fixed' ? 'fixed' : 'free'" } };
      d.derived.k = { expr: "ends == 'fixed' ? 1 kN : 2 m", quantity: "length", unit: "m" };
    });
    expect(problemsOf(source)[0]).toMatchObject({
      path: "derived.k.expr",
      message: expect.stringMatching(/\(with ends = fixed\)$/),
    });
  });
});

describe("the model generator", () => {
  it("a member between nodes that do not exist is refused with its path", () => {
    const problems = problemsOf(withChange((d) => (d.model.members[0].end = "C")));
    expect(problems[0]).toMatchObject({
      path: "model.members[0].end",
      message: "member `beam` ends at node `C`, which the model does not have (with the default inputs)",
    });
  });

  it("repetition over a count builds a multi-span beam, ids from the loop variable", () => {
    const source = withChange((d) => {
      d.inputs.n = { label: "Spans", quantity: "count", default: 3, min: 1, max: 20 };
      d.model.nodes = [
        {
          each: { i: "0 .. n" },
          id: "N{i}",
          x: "i * L",
          y: "0 m",
          support: { ux: { if: "i == 0 ? 'fixed' : 'free'" }, uy: "fixed" },
        },
      ];
      d.model.members = [
        { each: { i: "1 .. n" }, id: "S{i}", start: "N{i - 1}", end: "N{i}", E: "E", A: "5000 mm^2", I: "I", group: "beams" },
      ];
      d.model.load_cases = [{ each: { i: "1 .. n" }, id: "W{i}", loads: [{ member: "S{i}", direction: "global-y", w: "-w" }] }];
      d.model.combinations = [{ id: "all", factors: { W1: 1, W2: 1, W3: 1 } }];
      d.extracts = { M_max: { max_abs: "M", members: "beams", under: "all", unit: "kN m" } };
    });
    const out = compileOrThrow(source).evaluate();
    if (!out.ok) throw new Error(JSON.stringify(out));
    expect(out.evaluation.model.nodes.map((n) => n.id)).toEqual(["N0", "N1", "N2", "N3"]);
    expect(out.evaluation.model.members!.map((m) => [m.id, m.start, m.end])).toEqual([
      ["S1", "N0", "N1"],
      ["S2", "N1", "N2"],
      ["S3", "N2", "N3"],
    ]);
    // Three equal spans, uniform load on all: support moment 0.1wL² (AISC Manual Table 3-22, from memory; check-values.md).
    expect(out.evaluation.extracts.M_max.si).toBeCloseTo(0.1 * 10e3 * 36, 6);
  });

  it("a repetition too large is refused, not run", () => {
    const source = withChange((d) => {
      d.inputs.n = { label: "Spans", quantity: "count", default: 3 };
      d.model.nodes.push({ each: { i: "1 .. 100000" }, id: "X{i}", x: "i * 1 m", y: "1 m" });
    });
    expect(problemsOf(source)[0]).toMatchObject({
      path: "model.nodes[2].each.i",
      message: expect.stringMatching(/has 100000 values; at most 1000/),
    });
  });

  it("a model the supports let move is refused with the engine's words", () => {
    const problems = problemsOf(withChange((d) => (d.model.nodes[1].support = { uy: "free" })));
    expect(problems[0]).toMatchObject({
      path: "model",
      message:
        "The model with the default inputs cannot be analysed: The structure can turn as a whole about node A (x = 0 m, y = 0 m): every support reaction acts through that point and nothing holds the structure in rotation",
    });
  });
});

describe("compiling", () => {
  it("the same source compiles once: a second compile returns the cached standard", () => {
    const source = sourceOf(beamDefinition());
    const first = compileStandard(source);
    expect(first.ok).toBe(true);
    expect(compileStandard(source)).toBe(first);
  });
});

describe("a verification case worked out by hand", () => {
  const sha256 = "9f2c".repeat(16);
  const withHand = (hand: unknown) =>
    withChange((d) => {
      d.verification = [
        {
          name: "Uniform load, M = wL²/8 by hand",
          inputs: { L: "6 m", w: "10 kN/m" },
          expect: { M_max: { value: "10 kN/m * (6 m)^2 / 8", tolerance: 1e-9 } },
          source: "Hand calculation (closed form wL²/8, common practice)",
          hand_calculation: hand,
        },
      ];
    });

  it("names its checker and cites the attached file by sha256; the results carry them", () => {
    const standard = compileOrThrow(withHand({ checker: "Abena Harcastle", file: "tip-check.pdf", sha256 }));
    expect(runVerification(standard).map((r) => r.handCalculation)).toEqual([
      { checker: "Abena Harcastle", file: "tip-check.pdf", sha256 },
    ]);
  });

  it("is refused without a checker, or with a file named otherwise than by its sha256", () => {
    expect(problemsOf(withHand({ file: "tip-check.pdf", sha256 }))[0]).toMatchObject({
      path: "verification[0].hand_calculation.checker",
    });
    expect(problemsOf(withHand({ checker: "A. H.", file: "tip-check.pdf", sha256: "9F2C" }))[0]).toMatchObject({
      path: "verification[0].hand_calculation.sha256",
      message: expect.stringMatching(/64 lowercase hex digits/),
    });
  });
});
