/**
 * A narrative is MDX that is read, never run: everything that would execute or inject is refused when the
 * draft is saved, with the line and column in the file, and the rendered tree keeps only prose, KaTeX's
 * markup and the allowed components' placeholders.
 */
import { describe, expect, it } from "vitest";
import { narrativeToHast } from "@/lib/standards/narrative";
import { beamDefinition, compileOrThrow, problemsOf, sourceOf } from "./helpers";

/** The problems of a narrative placed after the test beam's definition, with the file line of its first line. */
function narrativeProblems(narrative: string) {
  const source = sourceOf(beamDefinition(), narrative);
  const firstLine = source.split("\n").lastIndexOf("---") + 2;
  return { problems: problemsOf(source), firstLine };
}

describe("what a narrative may not contain", () => {
  it.each([
    ["import fs from 'node:fs'", "Imports and exports are not allowed in a narrative"],
    ["export const x = 1", "Imports and exports are not allowed in a narrative"],
    [
      "Total {process.exit(1)}",
      "`{process.exit(1)}` would run as code; only comments {/* … */} may be written in braces (mathematics goes between $…$)",
    ],
    [
      "<script>alert(1)</script>",
      "<script> is not allowed; a narrative may use <Input>, <Derivation>, <Extract>, <Check>, <ModelDrawing>, <Diagram>",
    ],
    [
      '<img src="x" onError="alert(1)" />',
      "<img> is not allowed; a narrative may use <Input>, <Derivation>, <Extract>, <Check>, <ModelDrawing>, <Diagram>",
    ],
    ['<Input name="L" onClick="alert(1)" />', "<Input> has no attribute `onClick`; it takes name"],
    ["<Check name={bending} />", '<Check name> must be a quoted text, e.g. name="…"'],
    ["<Check {...props} />", "<Check> may not take {…} attributes"],
    ['<Check name="nothing" />', '<Check name="nothing"> names no check'],
    ['<Derivation of="L" />', '<Derivation of="L"> names no derived value'],
    ['<Diagram member="beam" of="torque" under="W" />', '<Diagram of="torque"> must be one of N, V, M, deflection'],
    ["Clearly 1<2 here", "A `<` that does not start a component must be written as `&lt;`, or inside mathematics: $1 < 2$"],
    ["<!-- a note -->", "HTML comments are not allowed; write a comment as {/* … */}"],
  ])("%s", (narrative, message) => {
    const { problems, firstLine } = narrativeProblems(`# Title\n\n${narrative}\n`);
    expect(problems[0]).toEqual({ path: "narrative", message, line: firstLine + 2, column: expect.any(Number) });
  });
});

describe("what it may", () => {
  it("prose, mathematics, comments in braces and the allowed components", () => {
    const narrative = [
      "# Beam",
      "",
      "The moment is $M = \\frac{w L^2}{8}$ {/* a note to the reviewer */} and",
      "",
      "$$",
      "\\Delta = \\frac{5 w L^4}{384 E I}",
      "$$",
      "",
      '<Input name="L" />',
      '<Derivation of="M_cap" />',
      '<Extract name="M_max" />',
      '<Check name="bending" />',
      "<ModelDrawing />",
      '<Diagram member="beam" of="M" under="W" />',
    ].join("\n");
    expect(compileOrThrow(sourceOf(beamDefinition(), narrative)).narrative).toBe(narrative);
  });

  it("renders to prose, KaTeX markup and placeholders, with nothing executable left", () => {
    const tree = JSON.stringify(narrativeToHast('Text $M = \\frac{wL^2}{8}$.\n\n<Check name="bending" />\n'));
    expect(tree).toContain('"tagName":"gusset-check","properties":{"dataName":"bending"}');
    expect(tree).toContain('"className":["katex"]');
    expect(tree).toContain('"tagName":"math"');
    expect(tree).not.toMatch(/"on[A-Z]|javascript:|"tagName":"script"/);
  });

  it("KaTeX's own commands cannot inject links or classes (trust is off)", () => {
    const tree = JSON.stringify(narrativeToHast("$\\href{javascript:alert(1)}{x}$ and $\\htmlClass{evil}{y}$"));
    // KaTeX prints the refused commands as red text (and keeps the source in the MathML annotation): no link, no class.
    expect(tree).not.toMatch(/"href":/);
    expect(tree).not.toMatch(/"className":\[[^\]]*"evil"/);
    expect(tree).toContain('"value":"\\\\href"');
  });
});
