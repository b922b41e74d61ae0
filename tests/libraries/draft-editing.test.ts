// The library draft editor's own logic, pure: the catalogue import's column mapping guessed from a header and
// turned into importCatalogue's mapping (and the demo catalogue read through it as the seed reads it), and a
// draft's problems put beside the entry they are in.
import { describe, expect, it } from "vitest";
import { catalogueSectionEntries, DEMO_CATALOGUE_MAPPING, importCatalogue, renderDemoCatalogueCsv } from "@/lib/libraries";
import { guessChoices, mappingOf } from "@/app/(app)/libraries/drafts/[draftId]/_components/catalogue-mapping";
import { problemsOf, readDraftDocument } from "@/app/(app)/libraries/drafts/[draftId]/_components/draft-document";

describe("the catalogue's column mapping", () => {
  it("guesses each column from a header written as the library names its values, in millimetres", () => {
    expect(guessChoices(["Designation", "Shape", "b", "D", "tf", "Ix", "Note"])).toEqual([
      { column: "Designation", role: "designation", unit: "" },
      { column: "Shape", role: "shape", unit: "" },
      { column: "b", role: "dimension:b", unit: "mm" },
      { column: "D", role: "dimension:D", unit: "mm" },
      { column: "tf", role: "dimension:tf", unit: "mm" },
      { column: "Ix", role: "property:Ix", unit: "mm⁴" },
      { column: "Note", role: "", unit: "" },
    ]);
  });

  it("maps a column to a value once only: a second column that suggests it is left out", () => {
    expect(guessChoices(["Name", "Designation"]).map((choice) => choice.role)).toEqual(["designation", ""]);
  });

  it("needs a designation, refuses a value mapped twice, and takes one shape for every row when no column holds it", () => {
    expect(mappingOf([{ column: "b", role: "dimension:b", unit: "mm" }], "i")).toEqual({
      ok: false,
      message: "Choose the column that holds each section's designation.",
    });
    const twice = mappingOf(
      [
        { column: "Name", role: "designation", unit: "" },
        { column: "b", role: "dimension:b", unit: "mm" },
        { column: "width", role: "dimension:b", unit: "mm" },
      ],
      "i",
    );
    expect(twice).toMatchObject({ ok: false, message: expect.stringContaining("“width”") });
    expect(
      mappingOf(
        [
          { column: "Name", role: "designation", unit: "" },
          { column: "D", role: "dimension:D", unit: "in" },
        ],
        "circle",
      ),
    ).toEqual({
      ok: true,
      mapping: { designation: "Name", shape: { all: "circle" }, dimensions: { D: { column: "D", unit: "in" } }, properties: {} },
    });
  });

  it("reads the demo catalogue as its own mapping does once the listed units are set to the file's (cm², cm⁴, cm³)", () => {
    const csv = renderDemoCatalogueCsv();
    const headers = csv.split(/\r?\n/)[0].split(",");
    const cm = { "mm²": "cm²", "mm³": "cm³", "mm⁴": "cm⁴" } as Record<string, string>;
    const choices = guessChoices(headers).map((choice) => ({ ...choice, unit: cm[choice.unit] ?? choice.unit }));
    const mapped = mappingOf(choices, "i");
    expect(mapped.ok).toBe(true);
    const ours = importCatalogue(csv, (mapped as Extract<typeof mapped, { ok: true }>).mapping);
    const theirs = importCatalogue(csv, DEMO_CATALOGUE_MAPPING);
    expect(ours.ok).toBe(true);
    expect(catalogueSectionEntries(ours.rows, "demo.csv")).toEqual(catalogueSectionEntries(theirs.rows, "demo.csv"));
  });
});

describe("a draft's problems, by entry", () => {
  it("puts each problem under the entry it is in, and the library's own apart", () => {
    const document = readDraftDocument(
      {
        title: "Tubes",
        entries: [
          { key: "Tube", origin: { from: "builder" }, shape: "circular-hollow", dimensions: { D: 0.1683, t: 0.006 } },
          { key: "Thick tube", origin: { from: "builder" }, shape: "circular-hollow", dimensions: { D: 0.06, t: 0.04 } },
        ],
      },
      "sections",
    );
    const { general, byEntry } = problemsOf(document);
    expect(general).toEqual([]);
    expect([...byEntry.keys()]).toEqual([1]);
    expect(byEntry.get(1)![0]).toMatchObject({ entry: "Thick tube", path: expect.stringMatching(/^entries\.1\.dimensions/) });
    // A problem of the library as a whole is its own, and does not hide those of its entries.
    const untitled = problemsOf({ ...document, title: "T" });
    expect(untitled.general.map((problem) => problem.path)).toEqual(["title"]);
    expect([...untitled.byEntry.keys()]).toEqual([1]);
  });

  it("reads a stored document that is not one as an empty draft of the library's kind", () => {
    expect(readDraftDocument(null, "materials")).toEqual({ kind: "materials", title: "", entries: [] });
  });
});
