/**
 * The source editor underlines each problem compileStandard reports at its line and column: the value the
 * problem points at, not the whole line, and somewhere sensible when the position is missing or stale.
 */
import { Text } from "@codemirror/state";
import { describe, expect, it } from "vitest";
import { compileStandard } from "@/lib/standards";
import { diagnosticsOf } from "@/components/standards/editor-diagnostics";
import { beamDefinition, sourceOf } from "./helpers";

const doc = (source: string) => Text.of(source.split("\n"));
const marked = (text: Text, d: { from: number; to: number }) => text.sliceString(d.from, d.to);

describe("problems as diagnostics", () => {
  const source = [
    "---",
    "title: Beam",
    "inputs:",
    '  L: { label: Span, quantity: length, unit: furlong, default: "6 m" }',
    "---",
    "# Beam",
  ].join("\n");
  const text = doc(source);

  it("underlines the value at the problem's line and column, up to the end of its flow item", () => {
    const [d] = diagnosticsOf(text, [
      { path: "inputs.L.unit", line: 4, column: 45, message: "`furlong` is not a unit Gusset knows" },
    ]);
    expect(marked(text, d!)).toBe("furlong");
    expect(d).toMatchObject({ severity: "error", message: "`furlong` is not a unit Gusset knows", source: "inputs.L.unit" });
    expect(text.lineAt(d!.from).number).toBe(4);
  });

  it("a quoted value runs to its closing quote", () => {
    const [d] = diagnosticsOf(text, [{ path: "inputs.L.default", line: 4, column: 63, message: "m" }]);
    expect(marked(text, d!)).toBe('"6 m"');
  });

  it("a problem at a key of a block mapping underlines the rest of the line; one without a column, the line's text", () => {
    const [atKey, noColumn] = diagnosticsOf(text, [
      { path: "title", line: 2, column: 8, message: "a" },
      { path: "inputs", line: 3, message: "b" },
    ]);
    expect(marked(text, atKey!)).toBe("Beam");
    expect(marked(text, noColumn!)).toBe("inputs:");
  });

  it("a problem without a line marks line 1, a stale line the last line, a column past the end the line's text", () => {
    const out = diagnosticsOf(text, [
      { path: "", message: "too long" },
      { path: "x", line: 99, column: 1, message: "stale" },
      { path: "y", line: 2, column: 80, message: "past" },
    ]);
    expect(out.map((d) => [d.message, text.lineAt(d.from).number])).toEqual([
      ["too long", 1],
      ["past", 2],
      ["stale", 6],
    ]);
    expect(
      marked(
        text,
        out.find((d) => d.message === "past")!,
      ),
    ).toBe("title: Beam");
    expect(out.find((d) => d.message === "too long")!.source).toBeUndefined();
  });

  it("marks what compileStandard refuses in a real source", () => {
    const definition = beamDefinition() as Record<string, any>; // eslint-disable-line @typescript-eslint/no-explicit-any
    definition.inputs.L.unit = "furlong";
    const bad = sourceOf(definition);
    const out = compileStandard(bad);
    if (out.ok) throw new Error("expected a refusal");
    const badText = doc(bad);
    const diagnostics = diagnosticsOf(badText, out.problems);
    expect(diagnostics.map((d) => [d.source, marked(badText, d)])).toContainEqual(["inputs.L.unit", "furlong"]);
  });
});
