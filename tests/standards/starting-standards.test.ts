/**
 * The firm's starting standards (content/standards): every version compiles, and every verification case
 * it carries passes on the current engine — an engine change that breaks a published standard fails here.
 * The published sources are cited in each file, beside its cases.
 */
import { describe, expect, it } from "vitest";
import { readdirSync, readFileSync } from "node:fs";
import path from "node:path";
import { compileStandard, definitionJsonSchema } from "@/lib/standards";
import { runVerification } from "@/lib/standards/verify";
import { citedHandCalculations } from "@/scripts/lib/starting-standards";

const root = path.resolve(import.meta.dirname, "../../content/standards");
const files = readdirSync(root, { recursive: true, encoding: "utf8" })
  .filter((f) => f.endsWith(".mdx"))
  .sort();

describe("the starting standards", () => {
  it("are there", () => {
    expect(files.length).toBeGreaterThanOrEqual(1);
  });

  describe.each(files)("%s", (file) => {
    const out = compileStandard(readFileSync(path.join(root, file), "utf8"));

    it("compiles", () => {
      expect(out.ok ? [] : out.problems).toEqual([]);
    });

    it("carries verification cases with their sources, and every case passes", () => {
      if (!out.ok) throw new Error("does not compile");
      const results = runVerification(out.standard);
      expect(results.length).toBeGreaterThanOrEqual(1);
      for (const r of results) {
        expect(r.source.length, r.name).toBeGreaterThan(10);
        expect(r.checks.length, r.name).toBeGreaterThanOrEqual(1);
        expect({ name: r.name, failure: r.failure, failed: r.checks.filter((c) => !c.pass) }).toEqual({
          name: r.name,
          failure: undefined,
          failed: [],
        });
      }
    });

    it("keeps every hand calculation its cases cite beside it, with the sha256 cited", () => {
      if (!out.ok) throw new Error("does not compile");
      const results = runVerification(out.standard);
      const cited = citedHandCalculations(path.dirname(file), { verification: results });
      expect(cited.map((c) => c.sha256)).toEqual(results.flatMap((r) => (r.handCalculation ? [r.handCalculation.sha256] : [])));
    });

    it("evaluates its defaults to a passing design with every check shown", () => {
      if (!out.ok) throw new Error("does not compile");
      const e = out.standard.evaluate();
      if (!e.ok) throw new Error(JSON.stringify(e));
      expect(Object.keys(e.evaluation.checks).length).toBeGreaterThanOrEqual(1);
      expect(Object.entries(e.evaluation.checks).filter(([, c]) => !c.pass)).toEqual([]);
      expect(e.evaluation.pass).toBe(true);
      expect(e.evaluation.equilibriumResidual).toBeLessThan(1e-9);
    });
  });
});

describe("the JSON Schema of the definition", () => {
  it("content/standard.schema.json is up to date (npm run standards:schema writes it)", () => {
    const committed = readFileSync(path.resolve(import.meta.dirname, "../../content/standard.schema.json"), "utf8");
    expect(JSON.parse(committed)).toEqual(definitionJsonSchema());
  });
});

describe("the complete example in content/README.md", () => {
  it("compiles, and its verification case passes", () => {
    const readme = readFileSync(path.resolve(import.meta.dirname, "../../content/README.md"), "utf8");
    const start = readme.indexOf("```yaml\n") + "```yaml\n".length;
    const example = readme.slice(start, readme.indexOf("```\n", start));
    const out = compileStandard(example);
    expect(out.ok ? [] : out.problems).toEqual([]);
    if (out.ok) expect(runVerification(out.standard).map((r) => r.pass)).toEqual([true]);
  });
});
