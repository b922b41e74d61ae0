/**
 * A material or load-combination set as the draft editor's form holds it, and back: numbers as typed (text), strengths
 * and moduli in MPa (what a standard tabulates them in), blank optional values left out. The form's schema turns the
 * values into the entry and checks that with the library's own entry schema, so a problem is named on the field it
 * is about (`E.value`, `combinations.2.factors.W`) — the same words the library's check gives.
 */
import { z } from "@/lib/domain/zod";
import {
  combinationSetEntrySchema,
  furtherValueSchema,
  materialEntrySchema,
  valueSymbol,
  type CombinationSetEntry,
  type MATERIAL_FAMILIES,
  type MATERIAL_VALUE_UNITS,
  type MaterialEntry,
} from "./document";

/** A value as typed, with the SI value it was opened with and its text then: left as it was, it is kept exactly. */
type Sourced = { value: string; source: string; opened?: { text: string; si: number } };

/** A material's values on the form: its symbol, its label, the unit typed and the power of ten to SI. */
export const MATERIAL_FORM_VALUES = [
  { name: "E", label: "Young's modulus E", unit: "MPa", toSI: 6 },
  { name: "G", label: "Shear modulus G", unit: "MPa", toSI: 6 },
  { name: "nu", label: "Poisson's ratio ν", unit: "", toSI: 0 },
  { name: "density", label: "Density ρ", unit: "kg/m³", toSI: 0 },
  { name: "fy", label: "Yield strength fy", unit: "MPa", toSI: 6 },
  { name: "fu", label: "Ultimate strength fu", unit: "MPa", toSI: 6 },
  { name: "alpha", label: "Thermal expansion α", unit: "1/K", toSI: 0 },
] as const;
type MaterialValueName = (typeof MATERIAL_FORM_VALUES)[number]["name"];

export type MaterialFormValues = {
  key: string;
  family: (typeof MATERIAL_FAMILIES)[number];
  note: string;
  /** Further values (timber's f_m_k, concrete's f_ck), in SI units as the library keeps them. */
  values: { symbol: string; value: string; unit: (typeof MATERIAL_VALUE_UNITS)[number]; source: string }[];
} & Record<MaterialValueName, Sourced>;

/** A number as typed; NaN for blank or not a number, which the entry's schema names as not a finite number. */
const numberOf = (text: string) => (text.trim() === "" ? Number.NaN : Number(text));
/** A number times 10^digits, shifted in its decimal text (355 MPa is exactly 355000000 Pa: no float dust). */
function shifted(value: number, digits: number): number {
  if (!Number.isFinite(value) || digits === 0) return value;
  const [mantissa, exponent = "0"] = String(value).split("e");
  return Number(`${mantissa}e${Number(exponent) + digits}`);
}
const isBlank = (sourced: Sourced) => sourced.value.trim() === "" && sourced.source.trim() === "";

/** The form's values of an entry (any shape: what a draft holds may be half written). */
export function materialFormValues(entry: unknown): MaterialFormValues {
  const e = (entry && typeof entry === "object" ? entry : {}) as Partial<Record<string, unknown>>;
  const sourced = (name: string, digits: number): Sourced => {
    const v = e[name] as { value?: unknown; source?: unknown } | undefined;
    const source = typeof v?.source === "string" ? v.source : "";
    if (typeof v?.value !== "number") return { value: "", source };
    const text = String(shifted(v.value, -digits));
    return { value: text, source, opened: { text, si: v.value } };
  };
  const values = (e.values && typeof e.values === "object" ? e.values : {}) as Record<
    string,
    { value?: unknown; unit?: unknown; source?: unknown }
  >;
  return {
    key: typeof e.key === "string" ? e.key : "",
    family: (typeof e.family === "string" ? e.family : "steel") as MaterialFormValues["family"],
    note: typeof e.note === "string" ? e.note : "",
    ...(Object.fromEntries(MATERIAL_FORM_VALUES.map(({ name, toSI }) => [name, sourced(name, toSI)])) as Record<
      MaterialValueName,
      Sourced
    >),
    values: Object.entries(values).map(([symbol, v]) => ({
      symbol,
      value: typeof v.value === "number" ? String(v.value) : "",
      unit: (typeof v.unit === "string" ? v.unit : "Pa") as MaterialFormValues["values"][number]["unit"],
      source: typeof v.source === "string" ? v.source : "",
    })),
  };
}

/** The entry the form's values give, as the draft keeps it (checked by the library, not here). */
export function materialOfForm(form: MaterialFormValues): Record<string, unknown> {
  const entry: Record<string, unknown> = { key: form.key, family: form.family };
  for (const { name, toSI } of MATERIAL_FORM_VALUES) {
    const sourced = form[name];
    // E is always written, so a blank E is named as missing; the others are left out while blank.
    if (name !== "E" && isBlank(sourced)) continue;
    const si = sourced.opened?.text === sourced.value ? sourced.opened.si : shifted(numberOf(sourced.value), toSI);
    entry[name] = { value: si, source: sourced.source };
  }
  const further = form.values.filter((row) => !(row.symbol.trim() === "" && isBlank(row)));
  if (further.length > 0)
    entry.values = Object.fromEntries(
      further.map((row) => [row.symbol.trim(), { value: numberOf(row.value), unit: row.unit, source: row.source }]),
    );
  if (form.note.trim() !== "") entry.note = form.note;
  return entry;
}

/**
 * The entry's problems on the form's fields. The entry keeps further values by symbol, so its check names them
 * `values.f_ck.value`; the form lists them as rows, so each is named on its row (`values.2.value`), where the
 * field is. A symbol that is not an identifier is named on its row's symbol in the symbol's own words, and that
 * row's value and source are checked as well (the record's check stops at the key); a symbol given on two rows
 * (the entry would keep only the last) is named on the later row.
 */
function materialFormIssues(form: MaterialFormValues): { path: (string | number)[]; message: string }[] {
  const parsed = materialEntrySchema.safeParse(materialOfForm(form));
  const out: { path: (string | number)[]; message: string }[] = [];
  const rows = form.values.map((row, index) => ({ index, symbol: row.symbol.trim(), row }));
  for (const issue of parsed.success ? [] : parsed.error.issues) {
    const [head, symbol, ...rest] = issue.path;
    if (head !== "values" || typeof symbol !== "string") {
      out.push({ path: issue.path.map((p) => (typeof p === "symbol" ? String(p) : p)), message: issue.message });
      continue;
    }
    for (const { index } of rows.filter((r) => r.symbol === symbol)) {
      if (issue.code === "invalid_key") {
        const own = valueSymbol.safeParse(symbol);
        out.push({ path: ["values", index, "symbol"], message: own.success ? issue.message : own.error.issues[0].message });
        const value = furtherValueSchema.safeParse({
          value: numberOf(rows[index].row.value),
          unit: rows[index].row.unit,
          source: rows[index].row.source,
        });
        for (const inner of value.success ? [] : value.error.issues)
          out.push({ path: ["values", index, ...inner.path.map(String)], message: inner.message });
      } else out.push({ path: ["values", index, ...rest.map(String)], message: issue.message });
    }
  }
  const seen = new Set<string>();
  for (const { index, symbol, row } of rows) {
    if (symbol === "" && isBlank(row)) continue;
    if (seen.has(symbol) && symbol !== "")
      out.push({
        path: ["values", index, "symbol"],
        message: `The symbol ${symbol} is given twice: give each further value its own.`,
      });
    seen.add(symbol);
  }
  return out;
}

export const materialFormSchema = z
  .custom<MaterialFormValues>()
  .superRefine((form, ctx) => {
    for (const { path, message } of materialFormIssues(form)) ctx.addIssue({ code: "custom", path, message });
  })
  .transform(materialOfForm)
  .pipe(materialEntrySchema) as unknown as z.ZodType<MaterialEntry, MaterialFormValues>;

export type CombinationSetFormValues = {
  key: string;
  reference: string;
  purpose: CombinationSetEntry["purpose"];
  note: string;
  loadKinds: {
    id: string;
    name: string;
    action: CombinationSetEntry["loadKinds"][number]["action"];
    cases: "add" | "alternatives";
  }[];
  /** Each combination's factors by load kind id, as typed; blank: the kind takes no part. */
  combinations: { id: string; label: string; leading: string; factors: Record<string, string> }[];
};

export function combinationSetFormValues(entry: unknown): CombinationSetFormValues {
  const e = (entry && typeof entry === "object" ? entry : {}) as Partial<Record<string, unknown>>;
  const list = (value: unknown) => (Array.isArray(value) ? (value as Record<string, unknown>[]) : []);
  const text = (value: unknown) => (typeof value === "string" ? value : "");
  return {
    key: text(e.key),
    reference: text(e.reference),
    purpose: (text(e.purpose) || "strength") as CombinationSetFormValues["purpose"],
    note: text(e.note),
    loadKinds: list(e.loadKinds).map((kind) => ({
      id: text(kind.id),
      name: text(kind.name),
      action: (text(kind.action) || "variable") as CombinationSetFormValues["loadKinds"][number]["action"],
      cases: kind.cases === "alternatives" ? "alternatives" : "add",
    })),
    combinations: list(e.combinations).map((combination) => ({
      id: text(combination.id),
      label: text(combination.label),
      leading: text(combination.leading),
      factors: Object.fromEntries(
        Object.entries((combination.factors ?? {}) as Record<string, unknown>).map(([kind, f]) => [
          kind,
          typeof f === "number" ? String(f) : "",
        ]),
      ),
    })),
  };
}

export function combinationSetOfForm(form: CombinationSetFormValues): Record<string, unknown> {
  const kinds = form.loadKinds.map((kind) => kind.id);
  return {
    key: form.key,
    reference: form.reference,
    purpose: form.purpose,
    loadKinds: form.loadKinds,
    combinations: form.combinations.map(({ id, label, leading, factors }) => ({
      id,
      label,
      // Only the set's kinds, and only those given a factor: a kind renamed or removed takes its factors with it.
      factors: Object.fromEntries(
        kinds.filter((kind) => (factors[kind] ?? "").trim() !== "").map((kind) => [kind, numberOf(factors[kind])]),
      ),
      ...(leading.trim() !== "" ? { leading } : {}),
    })),
    ...(form.note.trim() !== "" ? { note: form.note } : {}),
  };
}

export const combinationSetFormSchema = z
  .custom<CombinationSetFormValues>()
  .transform(combinationSetOfForm)
  .pipe(combinationSetEntrySchema) as unknown as z.ZodType<CombinationSetEntry, CombinationSetFormValues>;

/** What the editor needs to hold one kind of entry in a form: its schema, and the way to its values and back. */
export type EntryFormKind<Values> = {
  schema: z.ZodType<unknown, Values>;
  valuesOf: (entry: unknown) => Values;
  entryOf: (values: Values) => Record<string, unknown>;
};

export const MATERIAL_FORM: EntryFormKind<MaterialFormValues> = {
  schema: materialFormSchema,
  valuesOf: materialFormValues,
  entryOf: materialOfForm,
};

export const COMBINATION_SET_FORM: EntryFormKind<CombinationSetFormValues> = {
  schema: combinationSetFormSchema,
  valuesOf: combinationSetFormValues,
  entryOf: combinationSetOfForm,
};
