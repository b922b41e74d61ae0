/**
 * Units in and out. US customary conversion factors are exact by definition: international foot
 * 0.3048 m, avoirdupois pound 0.453 592 37 kg, standard gravity 9.806 65 m/s² (NIST Special Publication 811,
 * 2008 ed., Appendix B.8 and B.9), so 1 lbf = 4.448 221 615 260 5 N and the rest follow.
 */
import { describe, expect, it } from "vitest";
import type { Unit } from "mathjs";
import { math } from "@/lib/standards/units";
import { readInput } from "@/lib/standards/inputs";
import { formatQuantity, formatSignificant, prettyUnit } from "@/lib/standards";
import type { InputDefinition } from "@/lib/standards/definition";
import { expectClose } from "../engine/helpers";

const LBF = 0.45359237 * 9.80665;

/** A value read by readInput, in a unit (the test fails if it was refused). */
function inUnit(value: unknown, unit: string): number {
  return (value as Unit).toNumber(unit);
}

describe("US customary units, exact from their definitions (NIST SP 811, 2008, App. B)", () => {
  it.each([
    ["1 ft", "m", 0.3048],
    ["1 in", "m", 0.0254],
    ["1 lbf", "N", LBF],
    ["1 kip", "N", 1000 * LBF],
    ["2 kips", "N", 2000 * LBF],
    ["1 psi", "Pa", LBF / 0.0254 ** 2],
    ["1 ksi", "Pa", (1000 * LBF) / 0.0254 ** 2],
    ["1 psf", "Pa", LBF / 0.3048 ** 2],
    ["1 plf", "N/m", LBF / 0.3048],
    ["1 klf", "N/m", (1000 * LBF) / 0.3048],
    ["1 kip ft", "N m", 1000 * LBF * 0.3048],
    ["1 pcf", "N/m^3", LBF / 0.3048 ** 3],
  ])("%s = %s SI", (text, unit, si) => {
    expectClose(math.unit(text).toNumber(unit), si, 1e-14);
  });

  it("the values printed in NIST SP 811 Appendix B.8 (rounded there to 7 digits)", () => {
    expect(math.unit("1 lbf").toNumber("N")).toBeCloseTo(4.448222, 6);
    expect(math.unit("1 psi").toNumber("kPa")).toBeCloseTo(6.894757, 6);
    expect(math.unit("1 psf").toNumber("Pa")).toBeCloseTo(47.88026, 5);
  });
});

const span: InputDefinition = { label: "Span", quantity: "length", unit: "m", default: "6 m" };
const load: InputDefinition = { label: "Load", quantity: "force-per-length", unit: "kN/m", default: "10 kN/m" };

describe("typed input values", () => {
  it("reads a number with any length unit, and a bare number in the input's own unit", () => {
    expectClose(inUnit(readInput("L", span, "19.7 ft"), "m"), 19.7 * 0.3048, 1e-14);
    expectClose(inUnit(readInput("L", span, "6000 mm"), "m"), 6, 1e-14);
    expectClose(inUnit(readInput("L", span, 6), "m"), 6, 1e-14);
    expectClose(inUnit(readInput("L", span, "6"), "m"), 6, 1e-14);
  });

  it("reads line loads in SI and US units", () => {
    expectClose(inUnit(readInput("w", load, "0.8 kip/ft"), "N/m"), (800 * LBF) / 0.3048, 1e-14);
    expectClose(inUnit(readInput("w", load, "12 kN/m"), "N/m"), 12e3, 1e-14);
    expectClose(inUnit(readInput("w", load, "550 plf"), "N/m"), (550 * LBF) / 0.3048, 1e-14);
  });

  it("refuses a value of the wrong kind, an unknown unit, a unit from outside the trade and text that is no number", () => {
    expect(readInput("L", span, "12 kN")).toEqual({
      input: "L",
      message: expect.stringMatching(/^Span: 12 kN is a force .*enter a length, e.g. in m$/),
    });
    expect(readInput("L", span, "6 furlongs")).toEqual({ input: "L", message: 'Span: "furlongs" is not a unit Gusset knows' });
    expect(readInput("L", span, "5 h")).toEqual({ input: "L", message: 'Span: "h" is not a unit Gusset knows' });
    expect(readInput("L", span, "six metres")).toEqual({ input: "L", message: "Span: enter a number with its unit, e.g. 6 m" });
    expect(readInput("L", span, "2 * 3 m")).toMatchObject({ input: "L" });
    expect(readInput("L", span, Number.NaN)).toEqual({ input: "L", message: "Span: enter a finite number" });
    expect(readInput("L", span, "1e999 m")).toEqual({ input: "L", message: "Span: enter a finite number" });
  });

  it("reads counts as whole numbers and choices from their list", () => {
    const count: InputDefinition = { label: "Bays", quantity: "count", default: 2 };
    const choice: InputDefinition = { label: "Bases", quantity: "choice", default: "pinned", choices: ["pinned", "fixed"] };
    expect(readInput("n", count, "3")).toBe(3);
    expect(readInput("n", count, 2.5)).toEqual({ input: "n", message: "Bays: enter a whole number" });
    expect(readInput("b", choice, "fixed")).toBe("fixed");
    expect(readInput("b", choice, "welded")).toEqual({ input: "b", message: 'Bases: choose one of pinned, fixed, not "welded"' });
  });
});

describe("values printed with a display unit and significant figures", () => {
  it("rounds to significant figures without exponent form or −0", () => {
    expect(formatSignificant(36, 3)).toBe("36.0");
    expect(formatSignificant(115200.00000000001, 3)).toBe("115000");
    expect(formatSignificant(0.0042187, 3)).toBe("0.00422");
    expect(formatSignificant(-0, 3)).toBe("0");
    expect(formatSignificant(-1.2345e-7, 3)).toBe("-1.23×10⁻⁷");
    expect(formatSignificant(2.0e12, 3)).toBe("2.00×10¹²");
    expect(formatSignificant(-0.0004, 2)).toBe("-0.00040");
  });

  it("shows an SI value in its display unit, never re-expressed in another unit (no kJ for kN·m)", () => {
    expect(formatQuantity(36000, "moment", "kN m", 3)).toBe("36.0 kN·m");
    expect(formatQuantity(10 * 1000 * LBF * 0.3048, "moment", "kip ft", 4)).toBe("10.00 kip·ft");
    expect(formatQuantity(0.0042187, "length", "mm", 3)).toBe("4.22 mm");
    expect(prettyUnit("mm^4")).toBe("mm⁴");
  });
});
