// The draft editor's forms for materials and load-combination sets: every starting entry goes to the form's values
// and back unchanged (same entry hash), strengths and moduli show in MPa, and the form's schema names each problem on
// the field it is about, in the library's own words.
import { describe, expect, it } from "vitest";
import {
  combinationSetFormSchema,
  combinationSetFormValues,
  combinationSetOfForm,
  libraryEntryHash,
  materialFormSchema,
  materialFormValues,
  materialOfForm,
  type LibraryDocument,
} from "@/lib/libraries";
import { startingLibraries } from "@/scripts/lib/starting-libraries";

const byKind = <K extends LibraryDocument["kind"]>(kind: K) =>
  startingLibraries().find((l) => l.document.kind === kind)!.document as Extract<LibraryDocument, { kind: K }>;

const issuesOf = (result: { success: boolean; error?: { issues: { path: PropertyKey[]; message: string }[] } }) =>
  (result.error?.issues ?? []).map((issue) => [issue.path.join("."), issue.message]);

describe("material form", () => {
  it("takes every starting material to the form and back unchanged", async () => {
    for (const entry of byKind("materials").entries) {
      const back = materialFormSchema.parse(materialFormValues(entry));
      expect(await libraryEntryHash(back), entry.key).toBe(await libraryEntryHash(entry));
    }
  });

  it("shows moduli and strengths in MPa, and leaves a blank optional value out", () => {
    const steel = byKind("materials").entries.find((entry) => entry.key === "ASTM A992")!;
    const values = materialFormValues(steel);
    expect(values.E.value).toBe(String(steel.E.value / 1e6));
    expect(values.fy.value).toBe(String(steel.fy!.value / 1e6));
    expect(materialOfForm({ ...values, alpha: { value: "", source: "" } })).not.toHaveProperty("alpha");
    // A value typed in MPa is exactly that many pascals.
    expect(materialOfForm({ ...values, fy: { value: "355.5", source: "x" } }).fy).toEqual({ value: 355500000, source: "x" });
  });

  it("names each problem on its field", () => {
    const steel = materialFormValues(byKind("materials").entries.find((entry) => entry.key === "ASTM A992")!);
    expect(issuesOf(materialFormSchema.safeParse({ ...steel, E: { value: "-5", source: steel.E.source } }))).toEqual([
      ["E.value", "The Young's modulus E must be greater than zero."],
    ]);
    expect(issuesOf(materialFormSchema.safeParse({ ...steel, G: { value: "80000", source: "" } }))).toEqual([
      ["G.source", "Name the standard or source this value comes from (title, edition, clause)."],
    ]);
    expect(issuesOf(materialFormSchema.safeParse({ ...steel, fu: { value: "300", source: steel.fu.source } }))).toEqual([
      ["fu", "The ultimate strength fu is below the yield strength fy."],
    ]);
  });
});

describe("load-combination set form", () => {
  it("takes every starting set to the form and back unchanged", async () => {
    for (const entry of byKind("combinations").entries) {
      const back = combinationSetFormSchema.parse(combinationSetFormValues(entry));
      expect(await libraryEntryHash(back), entry.key).toBe(await libraryEntryHash(entry));
    }
  });

  it("names a zero factor on its combination and load kind, and drops a removed kind's factors", () => {
    const set = combinationSetFormValues(byKind("combinations").entries[0]);
    const [first, ...rest] = set.combinations;
    const kind = Object.keys(first.factors)[0];
    const zero = { ...set, combinations: [{ ...first, factors: { ...first.factors, [kind]: "0" } }, ...rest] };
    expect(issuesOf(combinationSetFormSchema.safeParse(zero))).toEqual([
      [`combinations.0.factors.${kind}`, "A factor of zero takes no part: leave the load kind out instead."],
    ]);
    const without = combinationSetOfForm({ ...set, loadKinds: set.loadKinds.filter((k) => k.id !== kind) }) as {
      combinations: { factors: Record<string, number> }[];
    };
    expect(without.combinations.every((c) => !(kind in c.factors))).toBe(true);
  });
});
