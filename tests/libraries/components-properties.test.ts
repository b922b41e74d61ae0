/**
 * The section's properties table, the builder and the catalogue table (components/libraries/) as the server
 * renders them: values in the units a section table uses, to four significant figures, against closed forms
 * worked by hand; listed values beside computed ones; the builder's refusals beside their field; the
 * catalogue's first page, its sorting buttons and the picker's choice.
 */
import { describe, expect, it } from "vitest";
import { createElement } from "react";
import { renderToStaticMarkup } from "react-dom/server";
import { buildDemoCatalogue, buildSectionOrThrow } from "@/lib/libraries";
import { SectionProperties } from "@/components/libraries/section-properties";
import { SectionBuilder } from "@/components/libraries/section-builder";
import { CatalogueTable, type CatalogueTableRow } from "@/components/libraries/catalogue-table";
import { formatNumber, formatPercent } from "@/components/libraries/format";
import { build } from "@/components/libraries/section-builder-input";

/** The text of a property's row: symbol, name, unit and value(s), tags stripped. */
function rowOf(html: string, key: string): string {
  const row = html.match(new RegExp(`<tr data-property="${key}"[^>]*>([\\s\\S]*?)</tr>`));
  if (!row) throw new Error(`no row for ${key}`);
  return row[1]
    .replace(/<[^>]+>/g, "|")
    .replace(/\|+/g, "|")
    .replace(/^\||\|$/g, "");
}
const properties = (props: Parameters<typeof SectionProperties>[0]) =>
  renderToStaticMarkup(createElement(SectionProperties, props));

describe("the properties table", () => {
  it("a solid rectangle 100 × 200 mm: A = bd, I = bd³/12, S = bd²/6, Z = bd²/4, r = d/√12 (closed forms, common practice)", () => {
    const html = properties({ section: buildSectionOrThrow({ shape: "rectangle", b: 0.1, d: 0.2 }) });
    expect(rowOf(html, "A")).toBe("A|area|mm²|20000"); // 100 × 200
    expect(rowOf(html, "Ix")).toBe("Ix|second moment of area about x|10⁶ mm⁴|66.67"); // 100 × 200³/12 = 66.67e6
    expect(rowOf(html, "Iy")).toBe("Iy|second moment of area about y|10⁶ mm⁴|16.67"); // 200 × 100³/12
    expect(rowOf(html, "Sx")).toBe("Sx|elastic modulus about x|10³ mm³|666.7"); // 100 × 200²/6
    expect(rowOf(html, "Zx")).toBe("Zx|plastic modulus about x|10³ mm³|1000"); // 100 × 200²/4
    expect(rowOf(html, "rx")).toBe("rx|radius of gyration about x|mm|57.74"); // 200/√12
    expect(html).toContain("J is exact: Saint-Venant");
  });

  it("an I section of plates 300 × 150, tf 10, tw 6, no fillets: properties worked from its three plates (common practice)", () => {
    const html = properties({ section: buildSectionOrThrow({ shape: "i", b: 0.15, d: 0.3, tf: 0.01, tw: 0.006 }) });
    // A = 2 × 150 × 10 + 280 × 6 = 4680 mm²
    expect(rowOf(html, "A")).toBe("A|area|mm²|4680");
    // Ix = (150 × 300³ − 144 × 280³)/12 = 74 076 000 mm⁴
    expect(rowOf(html, "Ix")).toMatch(/\|74\.08$/);
    // Iy = (2 × 10 × 150³ + 280 × 6³)/12 = 5 630 040 mm⁴
    expect(rowOf(html, "Iy")).toMatch(/\|5\.630$/);
    // Zx = b tf (d − tf) + tw (d − 2tf)²/4 = 435 000 + 117 600 = 552 600 mm³
    expect(rowOf(html, "Zx")).toMatch(/\|552\.6$/);
    // J = (2 b tf³ + (d − 2tf) tw³)/3 = (300 000 + 60 480)/3 = 120 160 mm⁴, thin-walled
    expect(rowOf(html, "J")).toBe("J|torsion constant|10⁶ mm⁴|0.1202");
    // b/2tf = 7.5, h/tw = 280/6 = 46.67: ratios, no unit
    expect(rowOf(html, "b_2tf")).toBe("b/2tf|flange width to thickness|ratio|7.500");
    expect(rowOf(html, "h_tw")).toMatch(/\|ratio\|46\.67$/);
    expect(html).toContain("J is thin-walled");
  });

  it("listed values beside computed ones, the difference signed and flagged past 1 % in words", () => {
    const section = buildSectionOrThrow({ shape: "rectangle", b: 0.1, d: 0.2 });
    const Ix = (0.1 * 0.2 ** 3) / 12;
    const html = properties({ section, listed: { A: 0.02 * 1.004, Ix: Ix * 1.015 } });
    expect(rowOf(html, "A")).toBe("A|area|mm²|20080|20000|+0.40 %");
    expect(rowOf(html, "Ix")).toBe("Ix|second moment of area about x|10⁶ mm⁴|67.67|66.67|+1.50 %|over 1.00 %");
    expect(rowOf(html, "Iy")).toBe("Iy|second moment of area about y|10⁶ mm⁴|not listed|16.67");
    expect(html.match(/data-flagged="true"/g)).toHaveLength(1);
  });

  it("formats: four significant figures, plain notation, a dash for what is not a number", () => {
    expect([12345, 4532.1, 62.4, 0.5, 0, Number.NaN, Infinity].map((v) => formatNumber(v))).toEqual([
      "12350",
      "4532",
      "62.40",
      "0.5000",
      "0",
      "—",
      "—",
    ]);
    expect([0.015, -0.0204, 0].map(formatPercent)).toEqual(["+1.50 %", "−2.04 %", "±0.00 %"]);
  });
});

describe("the section builder", () => {
  const builder = (props: Parameters<typeof SectionBuilder>[0]) => renderToStaticMarkup(createElement(SectionBuilder, props));

  it("draws and tabulates the section it starts from, every field labelled in mm", () => {
    const html = builder({ initial: { shape: "channel", dimensions: { b: 0.075, d: 0.15, tf: 0.01, tw: 0.006, r: 0.01 } } });
    expect(html).toContain('data-testid="section-drawing-svg"');
    expect(html).toContain('data-testid="section-properties-table"');
    for (const label of [
      "Flange width b (mm)",
      "Depth d (mm)",
      "Flange thickness tf (mm)",
      "Web thickness tw (mm)",
      "Root radius r (mm)",
    ])
      expect(html).toContain(`>${label}</label>`);
    expect(html).toMatch(/value="10"/);
    expect(html).not.toMatch(/NaN/);
  });

  it("a section that cannot exist: buildSection's sentence beside the field it names, nothing drawn, no NaN", () => {
    const html = builder({ initial: { shape: "i", dimensions: { b: 0.15, d: 0.3, tf: 0.16, tw: 0.007, r: 0 } } });
    const error = html.match(/data-testid="section-dimension-tf-error"[^>]*>([^<]+)</);
    expect(error?.[1]).toContain("flange thickness tf = 160 mm leaves no web");
    expect(html).toContain('aria-invalid="true"');
    expect(html).toContain('data-testid="section-builder-waiting"');
    expect(html).not.toContain('data-testid="section-drawing-svg"');
    expect(html).not.toMatch(/NaN/);
  });
});

describe("the builder's fields read as its input", () => {
  const I = { b: "150", d: "300", tf: "10.5", tw: "7", r: "14" };

  it("millimetres become metres; an empty radius is a sharp corner", () => {
    const out = build("i", { ...I, r: "" });
    expect(out.result.ok).toBe(true);
    if (!out.result.ok) return;
    expect(out.result.section.dimensions).toEqual({ shape: "i", b: 0.15, d: 0.3, tf: 0.0105, tw: 0.007, r: 0 });
  });

  it.each([
    ["tf", "1,5", "Type the flange thickness as a number of millimetres, e.g. 10.5."],
    ["tw", "abc", "Type the web thickness as a number of millimetres, e.g. 10.5."],
    ["d", "30000", "The depth is 30000 mm; no section is larger than 10 000 mm."],
  ])("%s typed as %s: a sentence for that field, the builder not run", (key, typed, message) => {
    const out = build("i", { ...I, [key]: typed });
    expect(out.unreadable).toEqual({ [key]: message });
    expect(out.result).toEqual({ ok: false, problems: [] });
  });

  it("an empty dimension that the shape needs: buildSection asks for it by name", () => {
    const out = build("i", { ...I, d: " " });
    expect(out.result.ok).toBe(false);
    if (out.result.ok) return;
    expect(out.result.problems).toContainEqual({ path: "d", message: "Give the depth d." });
  });
});

describe("the catalogue table", () => {
  const demo = buildDemoCatalogue();
  const rows: CatalogueTableRow[] = demo.map((s) => ({
    key: s.designation,
    shape: s.section.shape,
    dimensions: s.section.dimensions,
    properties: s.section.properties as unknown as Record<string, number>,
  }));
  const table = (props: Parameters<typeof CatalogueTable>[0]) => renderToStaticMarkup(createElement(CatalogueTable, props));
  const rendered = (html: string) => [...html.matchAll(/<tr data-row="([^"]+)"/g)].map((m) => m[1]);

  it("lists every demo section with its shape, main dimensions and properties, and sorting headings as buttons with aria-sort", () => {
    const html = table({ rows, label: "Demo sections" });
    expect(rendered(html)).toEqual(demo.map((s) => s.designation));
    expect(html).toContain("d 300 · b 150 · tf 10.5 · tw 7");
    expect(html.match(/<th[^>]*aria-sort="none"[^>]*><button type="button"/g)?.length).toBe(8); // all but Dimensions
    expect(html).toContain("Showing 1–27 of 27 sections");
    expect(html).not.toMatch(/NaN/);
  });

  it("5000 rows: one page of 50 is rendered, and the count says so", () => {
    const many = Array.from({ length: 5000 }, (_, i) => ({ ...rows[i % rows.length], key: `S${i}` }));
    const html = table({ rows: many });
    expect(rendered(html)).toHaveLength(50);
    expect(html).toContain("Showing 1–50 of 5000 sections, 50 to a page.");
    expect(html).toContain("Page 1 of 100");
  });

  it("the picker offers only the shapes a standard accepts, a radio per row, the chosen one checked", () => {
    const html = table({ rows, mode: "picker", shapes: ["channel", "angle"], value: "gc 200x80x11" });
    expect(rendered(html)).toEqual(demo.filter((s) => /^G[CL] /.test(s.designation)).map((s) => s.designation));
    expect(html).toMatch(/<input type="radio" aria-label="Choose GC 200x80x11"[^>]*checked=""/);
    expect(html.match(/checked=""/g)).toHaveLength(1);
    expect(html).toContain("Chosen: <strong");
    expect(html).toMatch(/<option value="channel">Channel<\/option><option value="angle">Angle<\/option>/);
  });

  it("in browsing, a row's designation links to its page when given one", () => {
    const html = table({ rows: [{ ...rows[0], href: "/libraries/steel/sections/GI%20160x90x7.5" }] });
    expect(html).toContain('href="/libraries/steel/sections/GI%20160x90x7.5"');
  });
});
