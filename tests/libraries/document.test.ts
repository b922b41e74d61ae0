/**
 * The library document (lib/libraries/document.ts): every problem named with its entry, duplicate keys, the
 * content hash independent of key order and spacing, the entry hash sensitive to a value, and section entries
 * completed with the builder's properties, listed values overriding them.
 */
import { describe, expect, it } from "vitest";
import {
  checkLibraryDocument,
  findEntry,
  libraryContentHash,
  libraryEntryHash,
  type LibraryDocument,
  type SectionEntry,
} from "@/lib/libraries";
import { expectClose } from "../engine/helpers";

const steel = (key: string, fy = 355e6) => ({
  key,
  family: "steel",
  E: { value: 210e9, source: "EN 1993-1-1:2005, 3.2.6 (from memory)" },
  fy: { value: fy, source: "EN 1993-1-1:2005, Table 3.1 (from memory)" },
});

function problemsOf(input: unknown) {
  const checked = checkLibraryDocument(input);
  if (checked.ok) throw new Error("expected the document to be refused");
  return checked.problems;
}

function documentOf(input: unknown): LibraryDocument {
  const checked = checkLibraryDocument(input);
  if (!checked.ok) throw new Error(JSON.stringify(checked.problems));
  return checked.document;
}

/** The same JSON with every object's keys in reverse order. */
function reverseKeys(value: unknown): unknown {
  if (Array.isArray(value)) return value.map(reverseKeys);
  if (value && typeof value === "object")
    return Object.fromEntries(
      Object.entries(value)
        .reverse()
        .map(([k, v]) => [k, reverseKeys(v)]),
    );
  return value;
}

describe("problems", () => {
  it("names every problem with its entry and path, never only the first", () => {
    const problems = problemsOf({
      kind: "materials",
      title: "Materials",
      entries: [
        steel("S355"),
        { ...steel("Bad E"), E: { value: -1, source: "EN 1993-1-1:2005" } },
        { ...steel("Weak"), fu: { value: 300e6, source: "EN 1993-1-1:2005" } },
        { ...steel("No source"), G: { value: 81e9, source: "" } },
      ],
    });
    expect(problems.map((p) => [p.entry, p.path])).toEqual([
      ["Bad E", "entries.1.E.value"],
      ["Weak", "entries.2.fu"],
      ["No source", "entries.3.G.source"],
    ]);
    expect(problems[0].message).toBe("The Young's modulus E must be greater than zero.");
    expect(problems[1].message).toBe("The ultimate strength fu is below the yield strength fy.");
    expect(problems[2].message).toMatch(/^Name the standard or source/);
  });

  it("refuses a Poisson's ratio of 0.5 or more, a further value in a unit it does not keep, and an unknown field", () => {
    const problems = problemsOf({
      kind: "materials",
      title: "Materials",
      entries: [
        { ...steel("A"), nu: { value: 0.5, source: "a source" } },
        { ...steel("B"), values: { f_ck: { value: 30e6, unit: "MPa", source: "a source" } } },
        { ...steel("C"), colour: "grey" },
      ],
    });
    expect(problems.map((p) => p.entry)).toEqual(["A", "B", "C"]);
    expect(problems[0].message).toBe("Poisson's ratio ν must be at least 0 and below 0.5.");
    expect(problems[1].path).toBe("entries.1.values.f_ck.unit");
  });

  it("refuses a combination set's faults, each named", () => {
    const problems = problemsOf({
      kind: "combinations",
      title: "Sets",
      entries: [
        {
          key: "Set",
          reference: "ASCE/SEI 7-16 §2.3.1",
          purpose: "strength",
          loadKinds: [
            { id: "D", name: "Dead", action: "permanent" },
            { id: "W", name: "Wind", action: "variable", cases: "alternatives" },
            { id: "X", name: "No action said" },
          ],
          combinations: [
            { id: "1", label: "1.4D", factors: { D: 1.4, L: 1.6 } },
            { id: "1", label: "0.9D + W", factors: { D: 0.9, W: 1 }, leading: "D" },
            { id: "3", label: "0W", factors: { W: 0 } },
          ],
        },
      ],
    });
    expect(problems.map((p) => [p.entry, p.path, p.message])).toEqual([
      ["Set", "entries.0.loadKinds.2.action", "Say whether the load kind is a permanent, variable or accidental action."],
      ["Set", "entries.0.combinations.2.factors.W", "A factor of zero takes no part: leave the load kind out instead."],
    ]);
    // Once the form is right, the set's own checks: unknown kind, a repeated id, a leading action that is not variable.
    const fixed = problemsOf({
      kind: "combinations",
      title: "Sets",
      entries: [
        {
          key: "Set",
          reference: "ASCE/SEI 7-16 §2.3.1",
          purpose: "strength",
          loadKinds: [
            { id: "D", name: "Dead", action: "permanent" },
            { id: "W", name: "Wind", action: "variable", cases: "alternatives" },
          ],
          combinations: [
            { id: "1", label: "1.4D", factors: { D: 1.4, L: 1.6 } },
            { id: "1", label: "0.9D + W", factors: { D: 0.9, W: 1 }, leading: "D" },
          ],
        },
      ],
    });
    expect(fixed.map((p) => [p.path, p.message])).toEqual([
      ["entries.0.combinations.0.factors.L", "Combination “1” has a factor on “L”, which is not one of the set's load kinds."],
      ["entries.0.combinations.1.id", "Two combinations are called “1”."],
      [
        "entries.0.combinations.1.leading",
        "Combination “1” is led by “D”, which must be a variable load kind of the set with a factor in it.",
      ],
    ]);
    expect(fixed.every((p) => p.entry === "Set")).toBe(true);
  });

  it("refuses a key given twice, spelt differently in case and spacing", () => {
    const problems = problemsOf({
      kind: "materials",
      title: "Materials",
      entries: [steel("S355  T ≤ 40"), steel("s355 t ≤ 40")],
    });
    expect(problems).toEqual([
      { path: "entries.1.key", entry: "s355 t ≤ 40", message: "“s355 t ≤ 40” is listed twice (as “S355  T ≤ 40” too)." },
    ]);
  });

  it("refuses what is not a document at all, without throwing", () => {
    expect(problemsOf(null)[0].path).toBe("");
    expect(problemsOf({ kind: "colours", title: "x", entries: [] }).length).toBeGreaterThan(0);
    expect(
      problemsOf({
        kind: "materials",
        title: "Materials",
        entries: [{ ...steel("NaN"), fy: { value: NaN, source: "x y z" } }],
      })[0],
    ).toMatchObject({
      entry: "NaN",
      path: "entries.0.fy.value",
    });
  });
});

describe("hashes", () => {
  const input = {
    kind: "materials",
    title: "Materials",
    entries: [steel("S355"), { ...steel("S275", 275e6), note: "t ≤ 40 mm" }],
  };

  it("the content hash is sha256 hex and does not depend on key order", async () => {
    const a = await libraryContentHash(documentOf(input));
    const b = await libraryContentHash(documentOf(reverseKeys(input)));
    expect(a).toMatch(/^[0-9a-f]{64}$/);
    expect(b).toBe(a);
  });

  it("the content hash and the entry's hash change when one value changes; the other entry's does not", async () => {
    const before = documentOf(input);
    const after = documentOf({ ...input, entries: [steel("S355", 345e6), input.entries[1]] });
    expect(await libraryContentHash(after)).not.toBe(await libraryContentHash(before));
    expect(await libraryEntryHash(after.entries[0])).not.toBe(await libraryEntryHash(before.entries[0]));
    expect(await libraryEntryHash(after.entries[1])).toBe(await libraryEntryHash(before.entries[1]));
  });

  it("an entry's hash is that of its checked form, defaults filled (a material with no further values has values {})", async () => {
    const document = documentOf(input);
    expect(document.entries[0]).toMatchObject({ values: {} });
    const withDefault = documentOf({ ...input, entries: [{ ...steel("S355"), values: {} }, input.entries[1]] });
    expect(await libraryEntryHash(withDefault.entries[0])).toBe(await libraryEntryHash(document.entries[0]));
  });
});

describe("section entries", () => {
  // A solid rectangle 0.1 m × 0.3 m: A = bh, Ix = bh³/12, Sx = bh²/6, Zx = bh²/4 (common practice, geometry).
  const b = 0.1;
  const d = 0.3;
  const document = documentOf({
    kind: "sections",
    title: "Sections",
    entries: [
      { key: "R 100x300", origin: { from: "builder" }, shape: "rectangle", dimensions: { b, d } },
      {
        key: "R 100x300 listed",
        origin: { from: "catalogue", file: "firm.csv", row: 2 },
        shape: "rectangle",
        dimensions: { b, d },
        listed: { Ix: 2.2e-4 },
      },
    ],
  });

  it("completes each entry with the builder's properties", () => {
    const built = document.entries[0] as SectionEntry;
    expectClose(built.computed.A, b * d);
    expectClose((built.computed as unknown as Record<string, number>).Ix, (b * d ** 3) / 12);
    expectClose(built.properties.Sx, (b * d * d) / 6);
    expectClose(built.properties.Zx, (b * d * d) / 4);
  });

  it("uses a listed value where the catalogue gives one, keeping the builder's beside it", () => {
    const listed = findEntry(document, "r 100X300  LISTED") as SectionEntry;
    expect(listed.properties.Ix).toBe(2.2e-4);
    expectClose((listed.computed as unknown as Record<string, number>).Ix, (b * d ** 3) / 12);
    expectClose(listed.properties.A, b * d);
  });

  it("names the entry when a section cannot be built or lists a property its shape lacks", () => {
    const problems = problemsOf({
      kind: "sections",
      title: "Sections",
      entries: [
        { key: "Thin", origin: { from: "builder" }, shape: "rectangle", dimensions: { b: 300, d } },
        { key: "Angle prop", origin: { from: "builder" }, shape: "rectangle", dimensions: { b, d }, listed: { Iu: 1e-5 } },
      ],
    });
    expect(problems.map((p) => [p.entry, p.path])).toEqual([
      ["Thin", "entries.0.dimensions.b"],
      ["Angle prop", "entries.1.listed.Iu"],
    ]);
    expect(problems[0].message).toMatch(/give dimensions in metres/);
    expect(problems[1].message).toBe("Angle prop: a rectangle section has no property “Iu”.");
  });
});
