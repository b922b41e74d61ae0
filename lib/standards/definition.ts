/**
 * The definition of a standard: the YAML header of its source file, as a zod schema (also exported as JSON
 * Schema). This describes shape only; names, units, dimensions and the model's references are checked when
 * the version is compiled (compile.ts), where each refusal can name its line.
 *
 * Every number is an expression (a string in mathjs syntax with units, e.g. `6 m` or `w * L^2 / 12`); a bare
 * YAML number is read as an expression too. Lists in the model may repeat an entry over loop variables
 * (`each`) and keep it only when a condition holds (`when`); ids and references are templates whose `{…}`
 * parts are expressions (`B{i}`, `col_{i}_{j}`).
 */
import { z } from "@/lib/domain/zod";
import { QUANTITIES } from "./units";

/** An expression: mathjs text, or a YAML number read as one. */
const expr = z.union([z.string().min(1, "an expression may not be empty"), z.number()]).transform((v) => String(v));
const text = z.string().trim().min(1);
/** Names of inputs, derived values, extracts and checks: a letter, then letters, digits and underscores. */
export const NAME_PATTERN = /^[A-Za-z][A-Za-z0-9_]{0,39}$/;
const name = z.string().regex(NAME_PATTERN, "a name is a letter followed by letters, digits or _ (at most 40)");
/** An id or a reference to one, with `{expression}` parts filled in per repetition. */
const template = z.union([z.string().min(1), z.number()]).transform((v) => String(v));

const quantity = z.enum(Object.keys(QUANTITIES) as [keyof typeof QUANTITIES, ...(keyof typeof QUANTITIES)[]]);

export const InputSchema = z
  .object({
    label: text,
    symbol: z.string().min(1).optional(),
    /** `section` and `material` take an entry of a firm library by name (library-inputs.ts). */
    quantity: z.union([quantity, z.literal("choice"), z.literal("section"), z.literal("material")]),
    /** The unit a value is shown in and a bare number is read in; required unless dimensionless, count or choice. */
    unit: z.string().optional(),
    default: z.union([z.string(), z.number()]),
    min: expr.optional(),
    max: expr.optional(),
    choices: z.array(text).min(2).optional(),
    /** A library input's library (its short name) and version: a published number, or `latest` (pinned at publication). */
    library: z
      .string()
      .regex(/^[a-z0-9]+(?:-[a-z0-9]+)*$/, "a library's short name is lower-case words joined by -")
      .optional(),
    version: z.union([z.number().int().min(1), z.literal("latest")]).optional(),
    /** The section shapes a section input takes (i, channel, rectangular-hollow, circular-hollow, rectangle, circle, angle). */
    shapes: z.array(text).min(1).optional(),
    /** The material families a material input takes (steel, timber, concrete, aluminium, masonry, other). */
    families: z.array(text).min(1).optional(),
    help: z.string().optional(),
  })
  .strict();
export type InputDefinition = z.infer<typeof InputSchema>;

export const DerivedSchema = z
  .object({
    label: text.optional(),
    symbol: z.string().min(1).optional(),
    expr,
    quantity,
    /** Display unit (omitted for dimensionless values). */
    unit: z.string().optional(),
    /** Significant figures shown. */
    digits: z.number().int().min(1).max(10).default(3),
  })
  .strict();
export type DerivedDefinition = z.infer<typeof DerivedSchema>;

/** Loop variables: `i: "0 .. n_bays"` (both ends included) or a list of texts, e.g. `side: [left, right]`. */
const each = z
  .record(name, z.union([z.string().regex(/\.\./, "a range is written `from .. to`"), z.array(text).min(1)]))
  .optional();
const when = expr.optional();

const restraint = z.union([
  z.enum(["fixed", "free"]),
  z.object({ spring: expr }).strict(),
  z.object({ settlement: expr, load_case: template.optional() }).strict(),
  /** An expression giving "fixed" or "free", e.g. `bases == 'fixed' ? 'fixed' : 'free'`. */
  z.object({ if: expr }).strict(),
]);
export const SUPPORT_PRESETS = {
  fixed: { ux: "fixed", uy: "fixed", rz: "fixed" },
  pinned: { ux: "fixed", uy: "fixed", rz: "free" },
  "roller-x": { ux: "free", uy: "fixed", rz: "free" },
  "roller-y": { ux: "fixed", uy: "free", rz: "free" },
} as const;
const support = z.union(
  [
    z.enum(Object.keys(SUPPORT_PRESETS) as [keyof typeof SUPPORT_PRESETS, ...(keyof typeof SUPPORT_PRESETS)[]]),
    z.object({ ux: restraint.optional(), uy: restraint.optional(), rz: restraint.optional() }).strict(),
  ],
  {
    error: `a support is one of ${Object.keys(SUPPORT_PRESETS).join(", ")}, or { ux, uy, rz } each fixed, free, a spring or a settlement`,
  },
);

const NodeTemplate = z.object({ id: template, x: expr, y: expr, support: support.optional(), each, when }).strict();

const MemberTemplate = z
  .object({
    id: template,
    start: template,
    end: template,
    kind: z.enum(["frame", "truss"]).default("frame"),
    E: expr,
    A: expr,
    I: expr.optional(),
    density: expr.optional(),
    releases: z.object({ start: z.boolean().optional(), end: z.boolean().optional() }).strict().optional(),
    /** Groups the member belongs to, for extracts and checks (`rafters`, `columns`). */
    group: z.union([name, z.array(name)]).optional(),
    each,
    when,
  })
  .strict();

const direction = z.enum(["local-x", "local-y", "global-x", "global-y"]);
const LoadTemplate = z.union([
  z.object({ node: template, fx: expr.optional(), fy: expr.optional(), mz: expr.optional(), each, when }).strict(),
  z
    .object({
      member: template,
      direction,
      w: expr,
      w_end: expr.optional(),
      from: expr.optional(),
      to: expr.optional(),
      projected: z.boolean().optional(),
      each,
      when,
    })
    .strict(),
  z.object({ member: template, direction, P: expr, at: expr, each, when }).strict(),
  z.object({ member: template, couple: expr, at: expr, each, when }).strict(),
  z.object({ self_weight: expr, each, when }).strict(),
]);

const LoadCaseTemplate = z
  .object({ id: template, name: z.string().optional(), loads: z.array(LoadTemplate).default([]), each, when })
  .strict();
const CombinationTemplate = z
  .object({ id: template, name: z.string().optional(), factors: z.record(z.string(), expr), each, when })
  .strict();
const EnvelopeTemplate = z.object({ id: template, of: z.array(template).min(1), each, when }).strict();

export const ModelTemplateSchema = z
  .object({
    nodes: z.array(NodeTemplate).min(1),
    members: z.array(MemberTemplate).default([]),
    load_cases: z.array(LoadCaseTemplate).min(1),
    combinations: z.array(CombinationTemplate).default([]),
    envelopes: z.array(EnvelopeTemplate).default([]),
  })
  .strict();
export type ModelTemplate = z.infer<typeof ModelTemplateSchema>;

/** Which results an extract or check reads: one id, several, or every combination of the model. */
const under = z.union([z.literal("all_combinations"), template, z.array(template).min(1)]);
const display = {
  label: text.optional(),
  symbol: z.string().min(1).optional(),
  unit: z.string().optional(),
  digits: z.number().int().min(1).max(10).default(3),
};

export const ExtractSchema = z.union([
  z
    .object({ reaction: z.object({ node: template, component: z.enum(["fx", "fy", "mz"]) }).strict(), under, ...display })
    .strict(),
  z
    .object({ displacement: z.object({ node: template, component: z.enum(["ux", "uy", "rz"]) }).strict(), under, ...display })
    .strict(),
  z
    .object({
      max_abs: z.enum(["N", "V", "M", "deflection", "relative_deflection"]),
      /** A member id or a group name. */
      members: template,
      under,
      ...display,
    })
    .strict(),
  z
    .object({
      value_at: z
        .object({ member: template, quantity: z.enum(["N", "V", "M", "deflection", "relative_deflection"]), at: expr })
        .strict(),
      under: template,
      ...display,
    })
    .strict(),
]);
export type ExtractDefinition = z.infer<typeof ExtractSchema>;

export const CheckSchema = z
  .object({
    label: text,
    demand: expr,
    capacity: expr,
    relation: z.enum(["<=", ">="]).default("<="),
    /** The clause the firm cites, e.g. "AISC 360-16 Eq. F2-1". */
    clause: text,
    /** What to tell the engineer when the check fails. */
    fails: text,
    unit: z.string().optional(),
    digits: z.number().int().min(1).max(10).default(3),
    /** Run for every member of a group under every result listed, on the forces acting together at each section. */
    for_each: z.object({ members: template, under }).strict().optional(),
  })
  .strict();
export type CheckDefinition = z.infer<typeof CheckSchema>;

export const AssumptionSchema = z.union([
  z.object({ text, check: expr }).strict(),
  z.object({ text, confirm: z.literal("preparer") }).strict(),
]);

export const VerificationSchema = z
  .object({
    name: text,
    inputs: z.record(name, z.union([z.string(), z.number()])).default({}),
    /** `extract`, `check.utilisation`, `check.demand`, `check.capacity` or a derived value → expected value and relative tolerance. */
    expect: z.record(z.string(), z.object({ value: expr, tolerance: z.number().positive().max(0.5) }).strict()),
    /** Where the expected values come from: title, edition, table or equation; "from memory" where recalled. */
    source: text,
    /**
     * Expected values worked out by hand: who checked them, and the calculation itself, attached to the standard as
     * a file (PDF, PNG or JPEG) and cited by its sha256, which the draft page shows when the file is attached.
     * Submitting and publishing need the file attached.
     */
    hand_calculation: z
      .object({
        checker: text,
        file: text,
        sha256: z.string().regex(/^[0-9a-f]{64}$/, "the file's sha256: 64 lowercase hex digits, as shown when it was attached"),
      })
      .strict()
      .optional(),
  })
  .strict();
export type VerificationCase = z.infer<typeof VerificationSchema>;

export const DefinitionSchema = z
  .object({
    title: text,
    category: text,
    tags: z.array(text).default([]),
    summary: text,
    scope: text,
    limitations: z.array(text).default([]),
    references: z.array(text).default([]),
    assumptions: z.array(AssumptionSchema).default([]),
    inputs: z.record(name, InputSchema),
    derived: z.record(name, DerivedSchema).default({}),
    model: ModelTemplateSchema,
    extracts: z.record(name, ExtractSchema).default({}),
    checks: z.record(name, CheckSchema).default({}),
    verification: z.array(VerificationSchema).default([]),
  })
  .strict();
export type Definition = z.infer<typeof DefinitionSchema>;

/** The definition format as JSON Schema (draft 2020-12), for editors and documentation. */
export function definitionJsonSchema(): Record<string, unknown> {
  return z.toJSONSchema(DefinitionSchema, { io: "input" }) as Record<string, unknown>;
}
