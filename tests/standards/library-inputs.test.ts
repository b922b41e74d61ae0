// Section and material inputs: a standard names a library and an entry; the evaluation reads the entry's
// values as `<input>_<value>` and records the entry, its library version and the hashes.
import { describe, expect, it } from "vitest";
import { compileStandard, evaluationToCanonicalJson } from "@/lib/standards";
import { derivationLatex } from "@/lib/standards/derivation";
import type { LibraryEntries } from "@/lib/standards/library-inputs";
import { bindLibrary } from "@/lib/libraries/bind";
import {
  buildDemoCatalogue,
  buildSectionOrThrow,
  checkLibraryDocument,
  libraryContentHash,
  type LibraryDocument,
} from "@/lib/libraries";
import { beamDefinition, sourceOf } from "./helpers";

const rel = (a: number, b: number) => Math.abs(a - b) / Math.abs(b);

async function sectionsLibrary(): Promise<{ document: LibraryDocument; entries: LibraryEntries }> {
  const demo = buildDemoCatalogue();
  const checked = checkLibraryDocument({
    kind: "sections",
    title: "Test sections",
    entries: demo.map(({ designation, section }) => {
      const { shape, ...dimensions } = section.dimensions;
      return { key: designation, origin: { from: "builder" }, shape, dimensions };
    }),
  });
  if (!checked.ok) throw new Error(JSON.stringify(checked.problems));
  const document = checked.document;
  const contentHash = await libraryContentHash(document);
  return { document, entries: { "test-sections": await bindLibrary(document, { number: 3, contentHash }) } };
}

async function materialsLibrary(): Promise<LibraryEntries> {
  const checked = checkLibraryDocument({
    kind: "materials",
    title: "Test materials",
    entries: [
      {
        key: "Test steel",
        family: "steel",
        E: { value: 200e9, source: "test value" },
        fy: { value: 345e6, source: "test value" },
      },
      { key: "Test timber", family: "timber", E: { value: 11e9, source: "test value" } },
    ],
  });
  if (!checked.ok) throw new Error(JSON.stringify(checked.problems));
  return {
    "test-materials": await bindLibrary(checked.document, { number: 1, contentHash: await libraryContentHash(checked.document) }),
  };
}

/** The test beam with its I, A and E from a section and a material input. */
function beamOnLibraries(overrides: Record<string, unknown> = {}): Record<string, unknown> {
  const d = beamDefinition();
  const inputs = { ...(d.inputs as Record<string, unknown>) };
  delete inputs.I;
  delete inputs.E;
  return {
    ...d,
    inputs: {
      ...inputs,
      beam: { label: "Beam section", quantity: "section", library: "test-sections", shapes: ["i"], default: "GI 300x150x10.5" },
      steel: { label: "Steel", quantity: "material", library: "test-materials", families: ["steel"], default: "Test steel" },
      ...overrides,
    },
    derived: { M_cap: { expr: "steel_fy * beam_Zx", quantity: "moment", unit: "kN m" } },
    model: {
      ...(d.model as Record<string, unknown>),
      members: [{ id: "beam", start: "A", end: "B", E: "steel_E", A: "beam_A", I: "beam_Ix", group: "beams" }],
    },
    extracts: {
      M_max: { max_abs: "M", members: "beams", under: "W", unit: "kN m" },
      delta: { max_abs: "relative_deflection", members: "beams", under: "W", unit: "mm" },
    },
  };
}

describe("a standard whose inputs are a library section and a library material", () => {
  it("reads the entry's properties into the model: midspan deflection 5wL⁴/384EI with the section's Ix (AWC Design Aid No. 6 (2005), Fig. 1)", async () => {
    const { entries } = await sectionsLibrary();
    const libraries = { ...entries, ...(await materialsLibrary()) };
    const compiled = compileStandard(sourceOf(beamOnLibraries()), libraries);
    if (!compiled.ok) throw new Error(JSON.stringify(compiled.problems));
    const out = compiled.standard.evaluate({ beam: "GI 400x180x13.5", L: "8 m", w: "12 kN/m" });
    if (!out.ok) throw new Error(JSON.stringify(out));
    const section = buildSectionOrThrow({ shape: "i", d: 0.4, b: 0.18, tw: 0.0085, tf: 0.0135, r: 0.018 });
    const Ix = section.properties.Ix;
    expect(rel(out.evaluation.extracts.delta.si, (5 * 12e3 * 8 ** 4) / (384 * 200e9 * Ix))).toBeLessThan(1e-9);
    // M = wL²/8 (AWC Design Aid No. 6 (2005), Fig. 1) against Fy·Zx from the entry
    expect(rel(out.evaluation.extracts.M_max.si, (12e3 * 64) / 8)).toBeLessThan(1e-9);
    expect(rel(out.evaluation.checks.bending.capacitySI, 345e6 * section.properties.Zx)).toBeLessThan(1e-12);
  });

  it("records the entry used: library, version, content hash, entry hash and the values read", async () => {
    const { entries } = await sectionsLibrary();
    const libraries = { ...entries, ...(await materialsLibrary()) };
    const compiled = compileStandard(sourceOf(beamOnLibraries()), libraries);
    if (!compiled.ok) throw new Error(JSON.stringify(compiled.problems));
    const out = compiled.standard.evaluate({ beam: "gi  300X150x10.5" });
    if (!out.ok) throw new Error(JSON.stringify(out));
    const beam = out.evaluation.inputs.beam;
    const library = entries["test-sections"];
    expect(beam.si).toBe("GI 300x150x10.5");
    expect(beam.entry).toMatchObject({
      library: "test-sections",
      version: 3,
      contentHash: library.contentHash,
      key: "GI 300x150x10.5",
      hash: library.entries["gi 300x150x10.5"].hash,
    });
    expect(beam.entry?.values.Ix.quantity).toBe("second-moment-of-area");
    expect(evaluationToCanonicalJson(out.evaluation)).toContain(library.entries["gi 300x150x10.5"].hash);
  });

  it("prints a library value in a derivation in the units tables use", async () => {
    const libraries = { ...(await sectionsLibrary()).entries, ...(await materialsLibrary()) };
    const compiled = compileStandard(sourceOf(beamOnLibraries()), libraries);
    if (!compiled.ok) throw new Error(JSON.stringify(compiled.problems));
    const out = compiled.standard.evaluate();
    if (!out.ok) throw new Error(JSON.stringify(out));
    const latex = derivationLatex(compiled.standard.definition, out.evaluation, "M_cap");
    expect(latex.symbolic).toContain("beam_{Zx}");
    expect(latex.substituted).toContain("\\mathrm{MPa}");
    expect(latex.substituted).toContain("\\mathrm{mm}^{3}");
  });

  it("refuses, naming the input: an unknown entry, a shape the input does not take, a family it does not take", async () => {
    const libraries = { ...(await sectionsLibrary()).entries, ...(await materialsLibrary()) };
    const compiled = compileStandard(sourceOf(beamOnLibraries()), libraries);
    if (!compiled.ok) throw new Error(JSON.stringify(compiled.problems));
    const problems = (inputs: Record<string, string>) => {
      const out = compiled.standard.evaluate(inputs);
      return out.ok || out.stage !== "inputs" ? [] : out.problems.map((p) => `${p.input}: ${p.message}`);
    };
    expect(problems({ beam: "GI 999x1x1" })).toEqual([
      "beam: Beam section: there is no section “GI 999x1x1” in version 3 of “test-sections”",
    ]);
    const hollow = buildDemoCatalogue().find((d) => d.section.shape === "rectangular-hollow")!.designation;
    expect(problems({ beam: hollow })).toEqual([`beam: Beam section: “${hollow}” is a rectangular-hollow; this input takes i`]);
    expect(problems({ steel: "Test timber" })).toEqual(["steel: Steel: “Test timber” is a timber; this input takes steel"]);
    expect(problems({ steel: "Test steel", beam: "" })).toEqual([
      "beam: Beam section: choose a section from the library “test-sections”",
    ]);
  });

  it("refuses a library that was not handed in, and a version other than the one pinned", async () => {
    const materials = await materialsLibrary();
    const missing = compileStandard(sourceOf(beamOnLibraries()), materials);
    expect(missing.ok).toBe(false);
    if (!missing.ok)
      expect(missing.problems.map((p) => p.message)).toContain(
        "Beam section: the library “test-sections” is not available (it has no published version, or it was not loaded) (with the default inputs)",
      );
    const libraries = { ...(await sectionsLibrary()).entries, ...materials };
    const pinned = beamOnLibraries({
      beam: { label: "Beam section", quantity: "section", library: "test-sections", version: 2, default: "GI 300x150x10.5" },
    });
    const wrongVersion = compileStandard(sourceOf(pinned), libraries);
    expect(wrongVersion.ok).toBe(false);
    if (!wrongVersion.ok)
      expect(wrongVersion.problems[0].message).toBe(
        "Beam section: this standard uses version 2 of “test-sections”, but version 3 was given (with the default inputs)",
      );
  });

  it("finds a value the entry does not have when the standard is compiled", async () => {
    const libraries = { ...(await sectionsLibrary()).entries, ...(await materialsLibrary()) };
    const d = beamOnLibraries();
    const typo = { ...d, derived: { M_cap: { expr: "steel_fy * beam_Zxx", quantity: "moment", unit: "kN m" } } };
    const out = compileStandard(sourceOf(typo), libraries);
    expect(out.ok).toBe(false);
    if (!out.ok) expect(out.problems[0].message).toContain("unknown name `beam_Zxx`");
  });

  it("says what is wrong with a library input's declaration, at its path", () => {
    const d = beamOnLibraries({
      beam: {
        label: "Beam section",
        quantity: "section",
        library: "test-sections",
        unit: "mm",
        min: "1 mm",
        default: "GI 300x150x10.5",
      },
      steel: { label: "Steel", quantity: "material", shapes: ["i"], default: 3 },
      L: { label: "Span", quantity: "length", unit: "m", default: "6 m", library: "test-sections" },
    });
    const out = compileStandard(
      sourceOf({
        ...d,
        derived: {
          M_cap: { expr: "300 kN m", quantity: "moment", unit: "kN m" },
          beam_x: { expr: "1 m", quantity: "length", unit: "m" },
        },
      }),
    );
    expect(out.ok).toBe(false);
    if (out.ok) return;
    const said = out.problems.map((p) => `${p.path}: ${p.message}`);
    expect(said).toEqual(
      expect.arrayContaining([
        "inputs.beam.unit: a section has no unit",
        "inputs.beam: a section has no `min` or `max`",
        "inputs.steel: a material input names its `library` (its short name)",
        "inputs.steel.default: the default is the name of a material in the library",
        "inputs.steel.shapes: a material has `families`, not `shapes`",
        "inputs.L.library: only a section or material input has `library`",
        "derived.beam_x: `beam_x` reads like a value of a section or material input; choose another name",
      ]),
    );
  });
});
