// The run form's own reading of "number + unit" (components/runs/quantity-text.ts), which shows the converted value
// while typing without mathjs, and the preview worker's ready message, which must be the evaluation bundle's own.
import { describe, expect, it } from "vitest";
import { formatConverted, readQuantityText } from "@/components/runs/quantity-text";
import { WORKER_READY } from "@/components/runs/use-preview";
import { READY_MESSAGE } from "@/lib/evaluation/protocol";

// Factors to kN/m. 1 kip/ft = 4448.2216152605 N / 0.3048 m = 14.5939029372 kN/m (NIST SP 811, 2008, Appendix B.8:
// 1 lbf = 4.4482216152605 N, 1 ft = 0.3048 m).
const KN_PER_M = { "kN/m": 1, "N/m": 0.001, "kip/ft": 14.593902937206 };

describe("readQuantityText", () => {
  it("reads a number with a listed unit and converts it to the field's own unit", () => {
    expect(readQuantityText("0.5 kip/ft", KN_PER_M, "kN/m")).toEqual({
      ok: true,
      number: 0.5,
      unit: "kip/ft",
      inOwnUnit: 7.296951468603,
    });
    expect(readQuantityText("  1200   N/m ", KN_PER_M, "kN/m")).toEqual({ ok: true, number: 1200, unit: "N/m", inOwnUnit: 1.2 });
  });

  it("takes a bare number in the field's own unit, and an exponent", () => {
    expect(readQuantityText("12", KN_PER_M, "kN/m")).toEqual({ ok: true, number: 12, unit: "kN/m", inOwnUnit: 12 });
    expect(readQuantityText("2.0e8 mm^4", { "mm^4": 1 }, "mm^4")).toEqual({
      ok: true,
      number: 2e8,
      unit: "mm^4",
      inOwnUnit: 2e8,
    });
  });

  it("treats `kN*m` and `kN m` alike", () => {
    expect(readQuantityText("3 kN*m", { "kN m": 1 }, "kN m")).toMatchObject({ ok: true, inOwnUnit: 3 });
  });

  it("leaves a unit it does not list to the server, and refuses what is not a number", () => {
    expect(readQuantityText("8 kN", KN_PER_M, "kN/m")).toEqual({ ok: true, number: 8, unit: "kN", inOwnUnit: null });
    expect(readQuantityText("ten", KN_PER_M, "kN/m")).toEqual({
      ok: false,
      message: "Enter a number with its unit, e.g. 6 kN/m.",
    });
    expect(readQuantityText("", KN_PER_M, "kN/m")).toEqual({ ok: false, message: "Enter a number with its unit, e.g. 6 kN/m." });
    expect(readQuantityText("3 m", {}, undefined)).toEqual({
      ok: false,
      message: "This value takes a plain number, without a unit.",
    });
  });
});

describe("formatConverted", () => {
  it("prints four significant figures, with an exponent only for very large or small values", () => {
    expect(formatConverted(9.0000125)).toBe("9");
    expect(formatConverted(7.296951468603)).toBe("7.297");
    expect(formatConverted(0)).toBe("0");
    expect(formatConverted(2e8)).toBe("2.000e+8");
    expect(formatConverted(1.5e-5)).toBe("1.500e-5");
  });
});

it("the preview waits for the message the evaluation bundle sends when it has loaded", () => {
  expect(WORKER_READY).toBe(READY_MESSAGE);
});
