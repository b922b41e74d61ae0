// SI results shown in US customary units. The factors are the exact definitions (NIST Special Publication 811,
// 2008 ed., Appendix B: 1 ft = 0.3048 m, 1 in = 0.0254 m, 1 lbf = 4.4482216152605 N); the spot values are the
// trade's familiar pairs: steel's E of 200 GPa is about 29 000 ksi and a 345 MPa yield about 50 ksi (common practice).
import { describe, expect, it } from "vitest";
import { resultUnit, showValue } from "@/lib/standards/display-units";

describe("showValue", () => {
  it("leaves SI display as the standard wrote it", () => {
    expect(showValue(36_000, "36.0 kN·m", "si")).toBe("36.0 kN·m");
  });

  it("converts each SI unit to its customary counterpart with the display's digits", () => {
    expect(showValue(36_000, "36.0 kN·m", "us")).toBe("26.6 kip·ft"); // 36 / 1.3558179483314004
    expect(showValue(6, "6.00 m", "us")).toBe("19.7 ft"); // 6 / 0.3048 = 19.685…
    expect(showValue(0.0139, "13.9 mm", "us")).toBe("0.547 in"); // 13.9 / 25.4 = 0.54724…
    expect(showValue(200e9, "200 GPa", "us")).toBe("29000 ksi"); // 29 007.5… to 3 figures
    expect(showValue(345e6, "345 MPa", "us")).toBe("50.0 ksi"); // 50.038…
    expect(showValue(10_000, "10.0 kN/m", "us")).toBe("0.685 kip/ft"); // 10 / 14.593902937206364
    expect(showValue(0.006, "6000 mm²", "us")).toBe("9.300 in²"); // 6000 / 645.16 = 9.29999…
    expect(showValue(2e-4, "2.00×10⁸ mm⁴", "us")).toBe("481 in⁴"); // 2e8 / 416 231.4256 = 480.507…
    expect(showValue(4448.2216152605, "4.45 kN", "us")).toBe("1.00 kip");
  });

  it("shows values without a unit, or in a unit with no customary counterpart, as written", () => {
    expect(showValue(0.5, "0.500", "us")).toBe("0.500");
    expect(showValue(0.01, "0.0100 rad", "us")).toBe("0.0100 rad");
    expect(showValue(Number.NaN, "— kN", "us")).toBe("— kN");
  });
});

describe("resultUnit", () => {
  it("gives the tables' and diagrams' units and factors from SI", () => {
    expect(resultUnit("force", "si")).toEqual({ unit: "kN", factor: 1e-3 });
    expect(resultUnit("force", "us").unit).toBe("kip");
    expect(4448.2216152605 * resultUnit("force", "us").factor).toBeCloseTo(1, 12);
    expect(1355.8179483314004 * resultUnit("moment", "us").factor).toBeCloseTo(1, 12);
    expect(0.0254 * resultUnit("displacement", "us").factor).toBeCloseTo(1, 12);
    expect(6_894_757.293168361 * resultUnit("stress", "us").factor).toBeCloseTo(1, 12);
  });
});
