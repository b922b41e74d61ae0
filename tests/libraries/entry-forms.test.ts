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

describe("material form: further values", () => {
  const c24 = () => materialFormValues(byKind("materials").entries.find((entry) => entry.key === "C24")!);
  type Row = ReturnType<typeof c24>["values"][number];
  const withRows = (...rows: Row[]) => {
    const values = c24();
    return { ...values, values: [...values.values, ...rows] };
  };
  const source = "Invented for the test, not from a standard";

  it("names each problem on its row's field, by the row's place in the list (where the form draws it)", () => {
    const form = withRows({ symbol: "f_x", value: "abc", unit: "Pa", source: "" });
    const row = form.values.length - 1;
    expect(issuesOf(materialFormSchema.safeParse(form))).toEqual([
      [`values.${row}.value`, "The value must be a finite number."],
      [`values.${row}.source`, "Name the standard or source this value comes from (title, edition, clause)."],
    ]);
  });

  it("a symbol that is not an identifier is named on the symbol in its own words, and its row's value and source are still checked", () => {
    const form = withRows({ symbol: "f c", value: "", unit: "Pa", source: "" });
    const row = form.values.length - 1;
    expect(issuesOf(materialFormSchema.safeParse(form))).toEqual([
      [`values.${row}.symbol`, "A value's symbol is a short identifier: f_ck, f_m_k, E_0_05, rho_k…"],
      [`values.${row}.value`, "The value must be a finite number."],
      [`values.${row}.source`, "Name the standard or source this value comes from (title, edition, clause)."],
    ]);
    const blank = withRows({ symbol: "", value: "5", unit: "Pa", source });
    expect(issuesOf(materialFormSchema.safeParse(blank))).toEqual([
      [`values.${blank.values.length - 1}.symbol`, "A value's symbol is a short identifier: f_ck, f_m_k, E_0_05, rho_k…"],
    ]);
  });

  it("a symbol given on two rows is named on the later one (the entry would keep only the last)", () => {
    const first = c24().values[0];
    const form = withRows({ ...first, value: "1" });
    expect(issuesOf(materialFormSchema.safeParse(form))).toEqual([
      [`values.${form.values.length - 1}.symbol`, `The symbol ${first.symbol} is given twice: give each further value its own.`],
    ]);
  });

  it("a blank row is left out, and a right one goes into the entry", () => {
    const form = withRows({ symbol: "", value: "", unit: "Pa", source: "" }, { symbol: "f_x", value: "2e6", unit: "Pa", source });
    expect(materialFormSchema.parse(form).values.f_x).toEqual({ value: 2e6, unit: "Pa", source });
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
