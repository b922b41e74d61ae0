/** The pieces of the engine's command-line report (scripts/lib/engine-report/): numbers, units, JSON input, unit hints, options. */
import { describe, expect, it } from "vitest";
import { formatNumber, formatResidual, roundSignificant } from "@/scripts/lib/engine-report/numbers";
import { inUnit, parseUnitSystem, UNIT_SYSTEMS } from "@/scripts/lib/engine-report/units";
import { firstJsonErrorOffset, lineAndColumn, parseJsonText, parserReason } from "@/scripts/lib/engine-report/json-input";
import { unitHints } from "@/scripts/lib/engine-report/model-hints";
import { parseArguments } from "@/scripts/lib/engine-report/cli";

describe("numbers to engineering precision", () => {
  it.each([
    [74999.99999999999, "75000"],
    [45000.000000000015, "45000"],
    [30, "30.00"],
    [-67.1932, "-67.19"],
    [0.0105468, "0.01055"],
    [0.001, "0.001000"],
    [9999.7, "10000"],
    [123456789, "123500000"],
    [2.1e11, "2.100e11"],
    [0.00012346, "1.235e-4"],
  ])("%s shows as %s", (v, shown) => {
    expect(formatNumber(v)).toBe(shown);
  });

  it("rounds to four significant figures", () => {
    expect(roundSignificant(74999.99999999999)).toBe(75000);
    expect(roundSignificant(-0.000123456)).toBe(-0.0001235);
  });

  it("shows noise below 1e-9 of the largest of its kind as 0, and keeps small values that are not noise", () => {
    expect(formatNumber(1.2e-17, 30)).toBe("0");
    expect(formatNumber(-3e-9, 30)).toBe("0");
    expect(formatNumber(3e-7, 30)).toBe("3.000e-7");
    expect(formatNumber(-0, 30)).toBe("0");
    expect(formatNumber(1.2e-17)).toBe("1.200e-17"); // with no scale, nothing is noise
  });

  it("shows residuals as what they are, to two figures", () => {
    expect(formatResidual(3.6379788070917e-15)).toBe("3.6e-15");
    expect(formatResidual(0)).toBe("0");
  });
});

describe("display units", () => {
  // Exact by definition: 1 ft = 0.3048 m, 1 in = 0.0254 m, 1 lbf = 4.4482216152605 N (NIST SP 811 (2008), Appendix B).
  const kipFt = UNIT_SYSTEMS.find((u) => u.name === "kip,ft")!;
  const kNmm = UNIT_SYSTEMS.find((u) => u.name === "kN,mm")!;

  it("converts from SI by exact definitions", () => {
    expect(inUnit(4448.2216152605, kipFt.force)).toBeCloseTo(1, 15);
    expect(inUnit(0.3048, kipFt.length)).toBe(1);
    expect(inUnit(0.0254, kipFt.deflection)).toBe(1);
    expect(inUnit(4448.2216152605 * 0.3048, kipFt.moment)).toBeCloseTo(1, 15);
    expect(inUnit(1355.8179483314004, kipFt.moment)).toBeCloseTo(1, 12);
    expect(inUnit(2.5, kNmm.length)).toBeCloseTo(2500, 10);
    expect(kNmm.moment.symbol).toBe("kN·m");
  });

  it("accepts the listed sets, whatever the case and spaces", () => {
    expect(parseUnitSystem("kN,m")).toMatchObject({ ok: true, units: { name: "kN,m" } });
    expect(parseUnitSystem("KIP, FT")).toMatchObject({ ok: true, units: { name: "kip,ft" } });
    expect(parseUnitSystem("kN,mm")).toMatchObject({ ok: true, units: { name: "kN,mm" } });
  });

  it("refuses another set and lists the valid ones", () => {
    expect(parseUnitSystem("lb,in")).toEqual({
      ok: false,
      message: 'Unknown unit set "lb,in"; the valid ones are N,m, kN,m, kN,mm, kip,ft (default N,m)',
    });
  });
});

describe("malformed JSON is placed by line and column", () => {
  it("a missing value: the position comes from a scan when the parser gives none", () => {
    const text = '{\n  "nodes": [],\n  "members": }\n';
    const out = parseJsonText(text);
    expect(out).toMatchObject({ ok: false, line: 3, column: 14, reason: "Unexpected token '}'" });
    if (!out.ok) expect(out.excerpt).toBe('  3 |   "members": }\n    |              ^');
  });

  it("a missing comma: the parser's own position", () => {
    const out = parseJsonText('{\n "a": 1\n "b": 2\n}');
    expect(out).toMatchObject({ ok: false, line: 3, column: 2, reason: "Expected ',' or '}' after property value" });
  });

  it("the end of the text", () => {
    expect(parseJsonText('{\n "a": [1, 2')).toMatchObject({ ok: false, line: 2, column: 12 });
    expect(parseJsonText("")).toMatchObject({ ok: false, line: 1, column: 1 });
  });

  it("a trailing comma, a single quote, a control character in a string", () => {
    expect(parseJsonText('{"a": [1, 2,]}')).toMatchObject({ ok: false, line: 1, column: 13 });
    expect(parseJsonText("{'a': 1}")).toMatchObject({ ok: false, line: 1, column: 2 });
    expect(parseJsonText('{"a": "x\ty"}')).toMatchObject({ ok: false, line: 1, column: 9 });
  });

  it("the scan agrees with the parser where the parser states a position", () => {
    for (const text of ['{"a":1}x', '{"a" 1}', "[1 2]", '{"a":1,}', "[tru]", '"\\q"', "-", "[1.]", "[01]", "[1e]", '"\\u12G4"']) {
      let stated = -1;
      try {
        JSON.parse(text);
      } catch (e) {
        const m = /at position (\d+)/.exec((e as Error).message);
        if (m) stated = Number(m[1]);
      }
      if (stated >= 0) expect(firstJsonErrorOffset(text), text).toBe(stated);
      expect(firstJsonErrorOffset(text), text).toBeGreaterThanOrEqual(0);
    }
    expect(firstJsonErrorOffset('{"a": [1, {"b": null}], "c": "\\u00e9"}')).toBe(-1);
  });

  it("a byte-order mark is not an error", () => {
    expect(parseJsonText('\ufeff{"a": 1}')).toEqual({ ok: true, value: { a: 1 } });
  });

  it("counts lines and columns from 1", () => {
    expect(lineAndColumn("ab\ncd", 0)).toEqual({ line: 1, column: 1 });
    expect(lineAndColumn("ab\ncd", 4)).toEqual({ line: 2, column: 2 });
    expect(parserReason("Bad control character in string literal in JSON at position 7 (line 1 column 8)")).toBe(
      "Bad control character in string literal",
    );
  });
});

describe("numbers that look like mm and MPa", () => {
  const model = (E: number, scale: number) => ({
    nodes: [
      { id: "A", x: 0, y: 0 },
      { id: "B", x: 6 * scale, y: 0 },
      { id: "C", x: 6 * scale, y: 4 * scale },
    ],
    members: [
      { id: "AB", start: "A", end: "B", E, A: 0.01, I: 1e-4 },
      { id: "BC", start: "B", end: "C", E, A: 0.01, I: 1e-4 },
    ],
  });

  it("E in MPa is named, with the factor", () => {
    expect(unitHints(model(210000, 1))).toEqual([
      "E = 210000 (members AB, BC) looks like MPa (N/mm²); the engine expects Pa (N/m²), so multiply by 1e6 (210000 MPa = 2.1e11 Pa)",
    ]);
  });

  it("lengths in mm are named, with the longest member", () => {
    expect(unitHints(model(210e9, 1000))).toEqual([
      "Members AB, BC are up to 6000 long: that looks like mm; the engine expects m, so divide the coordinates by 1000",
    ]);
  });

  it("an SI model gets no hint, and neither does input that is not a model", () => {
    expect(unitHints(model(210e9, 1))).toEqual([]);
    expect(unitHints(null)).toEqual([]);
    expect(unitHints({ members: "x", nodes: [1, null] })).toEqual([]);
  });
});

describe("options", () => {
  it("the report by default, in N and m", () => {
    expect(parseArguments(["m.json"])).toMatchObject({ file: "m.json", json: false, units: { name: "N,m" } });
    expect(parseArguments(["--units=kip,ft", "m.json"])).toMatchObject({ units: { name: "kip,ft" } });
    expect(parseArguments(["--json", "m.json", "--points", "5", "--compact"])).toMatchObject({
      json: true,
      points: 5,
      compact: true,
    });
  });

  it.each([
    [["m.json", "--units", "furlong"], /^Unknown unit set "furlong"; the valid ones are N,m, kN,m, kN,mm, kip,ft/],
    [["m.json", "--compact"], "--points and --compact shape the JSON output: add --json"],
    [["--json", "m.json", "--units", "kN,m"], "--units applies to the report; the JSON output is always SI (N, m, Pa)"],
    [["--json", "m.json", "--points", "1"], "--points needs a whole number of at least 2, not 1"],
    [["a.json", "b.json"], "One model at a time: a.json and b.json"],
    [["--verbose", "m.json"], "Unknown option --verbose"],
    [[], "Name a model file"],
  ])("%j is refused: %s", (argv, message) => {
    const out = parseArguments(argv);
    expect(typeof out).toBe("string");
    expect(out).toMatch(message);
  });
});
