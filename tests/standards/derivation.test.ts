/**
 * Equations with values substituted: the formula, the same formula with values and units, and the result —
 * all three from the expression the evaluation ran, so the print cannot disagree with the numbers. Each
 * string must typeset in KaTeX.
 */
import { describe, expect, it } from "vitest";
import { readFileSync } from "node:fs";
import path from "node:path";
import katex from "katex";
import { derivationLatex, nameLatex, unitLatex } from "@/lib/standards/derivation";
import { compileOrThrow } from "./helpers";

const source = readFileSync(path.resolve(import.meta.dirname, "../../content/standards/simply-supported-beam/1.mdx"), "utf8");
const beam = compileOrThrow(source);

describe("a derived value printed as formula → values → result", () => {
  const out = beam.evaluate({ F_y: "345 MPa", Z_x: "1.2e6 mm^3" });
  if (!out.ok) throw new Error(JSON.stringify(out));

  it("φb·Mn = 0.9·Fy·Zx = 0.9 × 345 MPa × 1.2×10⁶ mm³ = 373 kN·m (AISC 360-16 Eq. F2-1; arithmetic: 372.6 kN·m)", () => {
    expect(derivationLatex(beam.definition, out.evaluation, "phi_M_n")).toEqual({
      symbolic: "\\phi_b M_n = 0.9\\cdot{F_y}\\cdot{Z_x}",
      substituted: "= 0.9\\cdot{\\left(345\\,\\mathrm{MPa}\\right)}\\cdot{\\left(1200000\\,\\mathrm{mm}^{3}\\right)}",
      result: "= 373\\,\\mathrm{kN}\\,\\mathrm{m}",
    });
  });

  it("every derivation of the starting beam typesets in KaTeX", () => {
    for (const key of Object.keys(beam.definition.derived)) {
      for (const tex of Object.values(derivationLatex(beam.definition, out.evaluation, key)))
        expect(() => katex.renderToString(tex, { throwOnError: true })).not.toThrow();
    }
  });

  it("follows the inputs: a different span changes the substituted values and the result", () => {
    const longer = beam.evaluate({ L: "9 m" });
    if (!longer.ok) throw new Error(JSON.stringify(longer));
    expect(derivationLatex(beam.definition, longer.evaluation, "delta_limit")).toEqual({
      symbolic: "\\Delta_{lim} = \\frac{{L}}{360}",
      substituted: "= \\frac{{\\left(9\\,\\mathrm{m}\\right)}}{360}",
      result: "= 25.0\\,\\mathrm{mm}",
    });
  });
});

describe("names and units as LaTeX", () => {
  it.each([
    ["kN m", "\\mathrm{kN}\\,\\mathrm{m}"],
    ["mm^4", "\\mathrm{mm}^{4}"],
    ["kN/m", "\\mathrm{kN}/\\mathrm{m}"],
    ["kip ft", "\\mathrm{kip}\\,\\mathrm{ft}"],
  ])("%s", (unit, tex) => expect(unitLatex(unit)).toBe(tex));

  it("a name without a symbol gets its first underscore as a subscript", () => {
    expect(nameLatex("w_D")).toBe("w_{D}");
    expect(nameLatex("phi_M_n")).toBe("phi_{M\\_n}");
    expect(nameLatex("L")).toBe("L");
  });
});
