/**
 * The catalogue import's preview and a library's version diff (components/libraries/) as the server renders
 * them: a planted problem and a planted difference are listed with their row, column and values, and the
 * preview says nothing is imported while a problem stands; the diff finds an added, a removed and a changed
 * entry by normalised key, with each changed value old → new in its unit.
 */
import { describe, expect, it } from "vitest";
import { createElement } from "react";
import { renderToStaticMarkup } from "react-dom/server";
import {
  checkLibraryDocument,
  DEMO_CATALOGUE_MAPPING,
  importCatalogue,
  renderDemoCatalogueCsv,
  type LibraryDocument,
} from "@/lib/libraries";
import { ImportPreview } from "@/components/libraries/import-preview";
import { EntryDiff } from "@/components/libraries/entry-diff";
import { diffLibraryDocuments } from "@/components/libraries/entry-changes";

const text = (html: string) =>
  html
    .replace(/<[^>]+>/g, " ")
    .replace(/&quot;/g, '"')
    .replace(/&#x27;/g, "'")
    .replace(/\s+/g, " ");

/** The demo CSV with one cell replaced: the row of `designation`, the column named `column`. */
function plant(csv: string, designation: string, column: string, cell: (old: string) => string): string {
  const lines = csv.split("\r\n");
  const header = lines[0].split(",");
  const at = header.indexOf(column);
  return lines
    .map((line) => {
      if (!line.startsWith(`${designation},`)) return line;
      const fields = line.split(",");
      fields[at] = cell(fields[at]);
      return fields.join(",");
    })
    .join("\r\n");
}

describe("the import preview", () => {
  const csv = renderDemoCatalogueCsv();
  // GI 300x150x10.5 is line 5 (header on 1, the I sections from line 2); GC 150x75x10 is line 14.
  const differing = plant(csv, "GI 300x150x10.5", "Ix", (old) => String(Number(old) * 1.05));
  const broken = plant(differing, "GC 150x75x10", "tf", () => "ten");
  const preview = (file: string) =>
    renderToStaticMarkup(
      // Read by the rules the demo file was written by (1): under rules 2 its channels' and angles' J differ.
      createElement(ImportPreview, {
        result: importCatalogue(file, DEMO_CATALOGUE_MAPPING, { rules: 1 }),
        fileName: "steel.csv",
      }),
    );

  it("a planted problem: listed with its row and column, and nothing is imported until it is fixed", () => {
    const html = preview(broken);
    expect(html).toContain("Nothing is imported until every problem is fixed");
    const problem = html.match(/<tr data-row="14">([\s\S]*?)<\/tr>/);
    expect(text(problem![1])).toContain('14 tf Row 14: the flange thickness tf "ten" is not a number.');
    expect(html).toMatch(/data-testid="count-problems">1</);
    expect(html).toMatch(/data-testid="count-sections">26</);
    // Problems come before differences, which come before the rows.
    const [p, d, r] = ["import-problems", "import-differences", "catalogue-table"].map((id) =>
      html.indexOf(`data-testid="${id}"`),
    );
    expect(p).toBeGreaterThan(0);
    expect(p).toBeLessThan(d);
    expect(d).toBeLessThan(r);
  });

  it("a planted difference of 5 %: designation, property, listed and computed values and the difference", () => {
    const html = preview(differing);
    expect(html).toContain("Nothing is kept yet");
    const row = html.match(/<tr data-row="5" data-property="Ix">([\s\S]*?)<\/tr>/);
    // Listed 5 % above the demo file's value, itself the builder's rounded to four figures.
    const [, listed, computed, percent] = text(row![1])
      .trim()
      .match(/^GI 300x150x10\.5 5 Ix 10⁶ mm⁴ ([\d.]+) ([\d.]+) \+([\d.]+) %$/)!;
    expect(Number(listed) / Number(computed)).toBeCloseTo(1.05, 3);
    expect(Number(percent)).toBeCloseTo(5, 1);
    expect(html).toMatch(/data-testid="count-differences">1</);
  });

  it("a clean file: every row built, nothing kept until the import", () => {
    const html = preview(csv);
    expect(html).toContain("Every row was built");
    expect(html).toContain("Nothing is kept until you import");
    expect(html).not.toContain('data-testid="import-problems"');
    expect(html).not.toMatch(/NaN/);
  });
});

function document(
  entries: { key: string; dimensions: Record<string, number>; listed?: Record<string, number> }[],
): LibraryDocument {
  const out = checkLibraryDocument({
    kind: "sections",
    title: "Steel sections",
    entries: entries.map((e) => ({ origin: { from: "builder" }, shape: "i", ...e })),
  });
  if (!out.ok) throw new Error(JSON.stringify(out.problems));
  return out.document;
}

describe("the entry diff", () => {
  const i = (tf: number) => ({ b: 0.15, d: 0.3, tf, tw: 0.007, r: 0.014 });
  const before = document([
    { key: "GI 300x150x10.5", dimensions: i(0.0105) },
    { key: "GI 300x150x12", dimensions: i(0.012) },
    { key: "GI 300x150x9", dimensions: i(0.009) },
  ]);
  const after = document([
    { key: "gi 300X150x10.5", dimensions: i(0.0105) }, // the same entry, spelt differently
    { key: "GI 300x150x12", dimensions: i(0.0125) },
    { key: "GI 300x150x14", dimensions: i(0.014) },
  ]);

  it("finds the added, the removed and the changed entry by normalised key", () => {
    const diff = diffLibraryDocuments(before, after);
    expect(diff.added.map((e) => e.key)).toEqual(["GI 300x150x14"]);
    expect(diff.removed.map((e) => e.key)).toEqual(["GI 300x150x9"]);
    expect(diff.changed.map((c) => [c.key, c.formerKey])).toEqual([
      ["gi 300X150x10.5", "GI 300x150x10.5"],
      ["GI 300x150x12", undefined],
    ]);
    const tf = diff.changed[1].changes.find((c) => c.path === "dimensions.tf");
    expect(tf).toEqual({ path: "dimensions.tf", before: 0.012, after: 0.0125 });
    expect(diff.changed[0].changes).toEqual([]);
  });

  it("shows each as added, removed or changed in words, the changed values old → new in mm and table units", () => {
    const html = renderToStaticMarkup(
      createElement(EntryDiff, { before, after, beforeLabel: "version 1", afterLabel: "version 2" }),
    );
    expect(text(html)).toContain("From version 1 to version 2: 1 added, 1 removed, 2 changed, 0 unchanged (sections).");
    expect(text(html)).toMatch(/added GI 300x150x14 I section, d 300 · b 150 · tf 14 · tw 7 mm/);
    expect(text(html)).toMatch(/removed GI 300x150x9 /);
    expect(text(html)).toContain("changed gi 300X150x10.5 (was GI 300x150x10.5)");
    const tf = html.match(/<tr data-path="dimensions.tf">([\s\S]*?)<\/tr>/);
    expect(text(tf![1]).trim()).toBe("tf 12 mm → 12.5 mm");
    // A flange 0.5 mm thicker adds 150 × 0.5 mm² and takes 7 × 0.5 mm² from the web, twice: 2 × 143 × 0.5 = 143 mm².
    const area = html.match(/<tr data-path="properties.A">([\s\S]*?)<\/tr>/);
    const [, was, now] = text(area![1]).match(/A used by runs ([\d.]+) mm² → ([\d.]+) mm²/)!;
    expect(Math.abs(Number(now) - Number(was) - 143)).toBeLessThanOrEqual(1); // each shown to the whole mm²
    expect(html).not.toMatch(/NaN/);
  });

  it("a library's first version: every entry added", () => {
    const html = renderToStaticMarkup(createElement(EntryDiff, { before: null, after }));
    expect(text(html)).toContain("3 added, 0 removed, 0 changed, 0 unchanged");
  });
});

describe("the entry diff of materials and load-combination sets", () => {
  const checked = (input: unknown) => {
    const out = checkLibraryDocument(input);
    if (!out.ok) throw new Error(JSON.stringify(out.problems));
    return out.document;
  };
  const source = "A steel standard, Table 1 (a made-up source for this test)";
  const steel = (E: number) => ({ key: "S355", family: "steel", E: { value: E, source } });
  const set = (L: number) => ({
    key: "Strength",
    reference: "A loading standard, clause 2 (made up for this test)",
    purpose: "strength",
    loadKinds: [
      { id: "D", name: "Dead", action: "permanent" },
      { id: "L", name: "Live", action: "variable" },
    ],
    combinations: [{ id: "ULS-1", label: `1.2D + ${L}L`, factors: { D: 1.2, L } }],
  });

  it("a material's modulus in MPa, old → new", () => {
    const before = checked({ kind: "materials", title: "Materials", entries: [steel(200e9)] });
    const after = checked({ kind: "materials", title: "Materials", entries: [steel(210e9)] });
    const html = renderToStaticMarkup(createElement(EntryDiff, { before, after }));
    const row = html.match(/<tr data-path="E.value">([\s\S]*?)<\/tr>/);
    expect(text(row![1]).trim()).toBe("E 200000 MPa → 210000 MPa");
  });

  it("a combination's factor, named by the combination's id", () => {
    const before = checked({ kind: "combinations", title: "Combinations", entries: [set(1.6)] });
    const after = checked({ kind: "combinations", title: "Combinations", entries: [set(1.5)] });
    const changes = diffLibraryDocuments(before, after).changed[0].changes;
    expect(changes).toEqual([
      { path: "combinations[ULS-1].label", before: "1.2D + 1.6L", after: "1.2D + 1.5L" },
      { path: "combinations[ULS-1].factors.L", before: 1.6, after: 1.5 },
    ]);
  });
});
