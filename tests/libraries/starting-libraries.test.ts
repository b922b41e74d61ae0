/**
 * The starting libraries in content/libraries: each file passes checkLibraryDocument, its content hash is
 * pinned (a change to the content, or to what the check fills in, must be deliberate: update the hash here
 * with it), and every value is checked against its published source, named beside the check.
 */
import { describe, expect, it } from "vitest";
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import path from "node:path";
import {
  checkLibraryDocument,
  findEntry,
  libraryContentHash,
  libraryEntryHash,
  materialShearModulus,
  memberMaterial,
  shearModulusFromPoisson,
  weightDensity,
  type LibraryDocument,
  type MaterialEntry,
} from "@/lib/libraries";
import { LIBRARIES_DIR, startingLibraries } from "@/scripts/lib/starting-libraries";
import { expectClose } from "../engine/helpers";

const libraries = startingLibraries();
const byKind = <K extends LibraryDocument["kind"]>(kind: K) =>
  libraries.find((l) => l.document.kind === kind)!.document as Extract<LibraryDocument, { kind: K }>;
const materials = byKind("materials");
const sets = byKind("combinations");

const material = (key: string) => {
  const entry = findEntry(materials, key);
  if (!entry) throw new Error(`no material ${key}`);
  return entry as MaterialEntry;
};

const MPa = 1e6;
const GPa = 1e9;
const g = 9.80665; // standard gravity, CGPM 1901 (common practice)

describe("the files", () => {
  it("are one materials and one combinations document, each accepted", () => {
    expect(libraries.map((l) => [l.file, l.document.kind])).toEqual([
      ["load-combinations.json", "combinations"],
      ["materials.json", "materials"],
    ]);
    for (const { file } of libraries) {
      const checked = checkLibraryDocument(JSON.parse(readFileSync(path.join(LIBRARIES_DIR, file), "utf8")));
      expect(checked.ok, file).toBe(true);
    }
  });

  it("have pinned content hashes, the same computed twice", async () => {
    expect(await libraryContentHash(materials)).toBe("e725b59a57ee7a783347cd9e2544b7cca4ccbc618c08deaa9dea1fb686b1d03b");
    expect(await libraryContentHash(sets)).toBe("2330db1f9988a7b2f0ad7181a4bd6b838ce9b3247d00ebd18b99c1defbd11734");
    expect(await libraryContentHash(byKind("materials"))).toBe(await libraryContentHash(materials));
    const hashes = await Promise.all(materials.entries.map(libraryEntryHash));
    expect(new Set(hashes).size).toBe(materials.entries.length);
  });

  it("say 'from memory' in every source, since none was read from the page here", () => {
    const sources: string[] = [];
    for (const m of materials.entries) {
      for (const v of [m.E, m.G, m.nu, m.density, m.fy, m.fu, m.alpha]) if (v) sources.push(v.source);
      for (const v of Object.values(m.values)) sources.push(v.source);
    }
    for (const s of sets.entries) sources.push(s.reference);
    expect(sources.filter((s) => !s.includes("from memory"))).toEqual([]);
  });
});

describe("materials", () => {
  it("ASTM A992", () => {
    const m = material("ASTM A992");
    // ANSI/AISC 360-16, Symbols: E = 29,000 ksi (200 000 MPa), G = 11,200 ksi (77 200 MPa) (from memory)
    expectClose(m.E.value, 200_000 * MPa);
    expectClose(m.G!.value, 77_200 * MPa);
    // ASTM A992/A992M, Table 2: Fy = 50 ksi [345 MPa], Fu = 65 ksi [450 MPa] minimum (from memory; check-values.md)
    expectClose(m.fy!.value, 345 * MPa);
    expectClose(m.fu!.value, 450 * MPa);
    // AISC Steel Construction Manual, 15th ed., Part 17: 490 lb/ft³ (from memory); lb = 0.45359237 kg, ft = 0.3048 m exactly
    expectClose(m.density!.value, (490 * 0.45359237) / 0.3048 ** 3);
    // AISC Manual, 15th ed., Part 17: 6.5 × 10⁻⁶ per °F (from memory); 1 K = 1.8 °F
    expectClose(m.alpha!.value, 6.5e-6 * 1.8);
  });

  it.each([
    // EN 1993-1-1:2005, Table 3.1 (from memory): S275 t ≤ 40 mm 275/430; S355 t ≤ 40 mm 355/510, 40 < t ≤ 80 mm 335/470
    ["S275 (EN 10025-2), t ≤ 40 mm", 275, 430],
    ["S355 (EN 10025-2), t ≤ 40 mm", 355, 510],
    ["S355 (EN 10025-2), 40 mm < t ≤ 80 mm", 335, 470],
  ])("%s", (key, fy, fu) => {
    const m = material(key);
    expectClose(m.fy!.value, fy * MPa);
    expectClose(m.fu!.value, fu * MPa);
    // EN 1993-1-1:2005, 3.2.6(1): E = 210 000 N/mm², ν = 0.3, G = E/2(1 + ν) ≈ 81 000 N/mm², α = 12 × 10⁻⁶/K (from memory)
    expectClose(m.E.value, 210_000 * MPa);
    expectClose(m.nu!.value, 0.3);
    expectClose(m.G!.value, 81_000 * MPa);
    expectClose(shearModulusFromPoisson(m.E.value, m.nu!.value), m.G!.value, 0.003); // "≈": 80 769 against 81 000
    expectClose(m.alpha!.value, 12e-6);
    // EN 1991-1-1:2002, Table A.4: steel 77.0 to 78.5 kN/m³, the upper value kept (from memory)
    expectClose(weightDensity(m)!, 78.5e3);
  });

  it("C24", () => {
    const m = material("C24");
    const v = (symbol: string) => m.values[symbol].value;
    // EN 338:2016, Table 1, C24 (from memory)
    expectClose(m.E.value, 11.0 * GPa); // E0,mean
    expectClose(m.G!.value, 0.69 * GPa); // Gmean
    expectClose(m.density!.value, 420); // ρmean
    expectClose(v("f_m_k"), 24 * MPa);
    expectClose(v("f_t_0_k"), 14.5 * MPa);
    expectClose(v("f_t_90_k"), 0.4 * MPa);
    expectClose(v("f_c_0_k"), 21 * MPa);
    expectClose(v("f_c_90_k"), 2.5 * MPa);
    expectClose(v("f_v_k"), 4.0 * MPa);
    expectClose(v("E_0_05"), 7.4 * GPa);
    expectClose(v("E_90_mean"), 0.37 * GPa);
    expectClose(v("rho_k"), 350);
    expect(m.values.rho_k.unit).toBe("kg/m³");
    expect(m.fy).toBeUndefined(); // strengths of timber are kept by symbol, never as a yield strength
  });

  it("C30/37", () => {
    const m = material("C30/37");
    const v = (symbol: string) => m.values[symbol].value;
    // EN 1992-1-1:2004, Table 3.1, C30/37 (from memory)
    expectClose(v("f_ck"), 30 * MPa);
    expectClose(v("f_ck_cube"), 37 * MPa);
    expectClose(v("f_cm"), 38 * MPa);
    expectClose(v("f_ctm"), 2.9 * MPa);
    expectClose(v("f_ctk_005"), 2.0 * MPa);
    expectClose(v("f_ctk_095"), 3.8 * MPa);
    expectClose(m.E.value, 33 * GPa);
    // EN 1992-1-1:2004, Table 3.1: Ecm = 22(fcm/10)^0.3 GPa, which the table rounds to 33 (from memory)
    expectClose(22 * (v("f_cm") / 10 / MPa) ** 0.3 * GPa, m.E.value, 0.01);
    // EN 1992-1-1:2004, 3.1.3(4) ν = 0.2 and 3.1.3(5) α = 10 × 10⁻⁶/K (from memory)
    expectClose(m.nu!.value, 0.2);
    expectClose(m.alpha!.value, 10e-6);
    // EN 1991-1-1:2002, Table A.1: 24 kN/m³ + 1 kN/m³ for normal reinforcement (from memory)
    expectClose(weightDensity(m)!, 25e3);
    expect(m.G).toBeUndefined();
    // No listed G: the isotropic relation from E and ν (common practice)
    const G = materialShearModulus(m)!;
    expect(G.from).toBe("poisson");
    expectClose(G.value, m.E.value / (2 * (1 + 0.2)));
  });

  it("EN AW-6082 T6", () => {
    const m = material("EN AW-6082 T6, extruded profile, 5 mm < t ≤ 15 mm");
    // EN 1999-1-1:2007, 3.2.5(1): E = 70 000, G = 27 000 N/mm², ν = 0.3, α = 23 × 10⁻⁶/K, ρ = 2700 kg/m³ (from memory)
    expectClose(m.E.value, 70_000 * MPa);
    expectClose(m.G!.value, 27_000 * MPa);
    expectClose(m.nu!.value, 0.3);
    expectClose(m.alpha!.value, 23e-6);
    expectClose(m.density!.value, 2700);
    // EN 1999-1-1:2007, Table 3.2b, extruded profile 5 < t ≤ 15 mm: fo = 260, fu = 310 N/mm² (from memory)
    expectClose(m.fy!.value, 260 * MPa);
    expectClose(m.fu!.value, 310 * MPa);
  });

  it("what a model takes from an entry", () => {
    const m = material("S355 (EN 10025-2), t ≤ 40 mm");
    const member = memberMaterial(m);
    expectClose(member.E, 210e9);
    expectClose(member.density, 78.5e3 / g);
    const G = materialShearModulus(m)!;
    expect(G.from).toBe("listed");
    expectClose(G.value, 81e9);
    const noDensity = { ...m, density: undefined, G: undefined, nu: undefined };
    expect(Object.keys(memberMaterial(noDensity))).toEqual(["E"]);
    expect(weightDensity(noDensity)).toBeNull();
    expect(materialShearModulus(noDensity)).toBeNull();
    expect(() => shearModulusFromPoisson(210e9, 0.5)).toThrow("Poisson's ratio must be at least 0 and below 0.5, not 0.5.");
    expect(() => shearModulusFromPoisson(Number.NaN, 0.3)).toThrow("Young's modulus must be a positive number, not NaN.");
  });
});

describe("the loader", () => {
  it("names each library by its file and refuses a faulty file, naming it and every problem", () => {
    expect(libraries.map((l) => l.name)).toEqual(["load-combinations", "materials"]);
    const dir = mkdtempSync(path.join(tmpdir(), "gusset-libraries-"));
    try {
      writeFileSync(path.join(dir, "a.json"), "{ not json");
      expect(() => startingLibraries(dir)).toThrow(/^content\/libraries\/a\.json is not JSON: /);
      writeFileSync(
        path.join(dir, "a.json"),
        JSON.stringify({
          kind: "materials",
          title: "Bad",
          entries: [{ key: "X", family: "steel", E: { value: 0, source: "a source" } }],
        }),
      );
      expect(() => startingLibraries(dir)).toThrow(
        "content/libraries/a.json is not a library document:\n  entries.0.E.value (X): The Young's modulus E must be greater than zero.",
      );
    } finally {
      rmSync(dir, { recursive: true, force: true });
    }
  });
});

describe("content/libraries/README.md", () => {
  it("names every entry of every starting library by its key", () => {
    const readme = readFileSync(path.join(LIBRARIES_DIR, "README.md"), "utf8");
    const keys = libraries.flatMap((l) => l.document.entries.map((e) => e.key));
    expect(keys.filter((key) => !readme.includes(key))).toEqual([]);
  });
});
