// After a withdrawal: the mapping of old inputs onto the successor's (checked against both versions' inputs by
// lib/use-cases/withdrawal-mapping.ts once their definitions are read), the outcome of an affected calc revision,
// and a batch re-run.
import { z } from "../zod";
import { plainText } from "./text";
import { runInputsSchema } from "./jobs";

const inputKey = z
  .string()
  .regex(/^[A-Za-z][A-Za-z0-9_]{0,63}$/, "An input's key is a letter, then letters, digits or underscores (at most 64).");

export const EMPTY_MAPPING = { rename: {}, values: {}, drop: [] };

/** Renamed keys (old → successor's), values for the successor's new inputs, and old inputs it has no place for. */
export const inputMappingSchema = z
  .object({
    rename: z.record(inputKey, inputKey).default({}),
    values: runInputsSchema.default({}),
    drop: z.array(inputKey).max(200, "At most 200 inputs dropped.").default([]),
  })
  .strict();
export type InputMappingInput = z.input<typeof inputMappingSchema>;

/** "" from a form's empty choice means none. */
const optionalId = (what: string) =>
  z
    .union([z.literal(""), z.uuid(`Choose ${what}.`)])
    .optional()
    .transform((value) => value || undefined);

export const successorFields = {
  /** A published, not withdrawn version of the same standard. */
  successorVersionId: optionalId("the version that replaces it"),
  mapping: inputMappingSchema.optional(),
};

/** A library withdrawal's replacement: the entry runs take instead. */
export const replacementField = {
  replacementKey: z
    .union([z.literal(""), plainText().pipe(z.string().trim().min(1).max(80, "An entry's name is at most 80 characters."))])
    .optional()
    .transform((value) => value || undefined),
};

/** Naming the successor after the withdrawal (a version that fixes it came out later). */
export const declareSuccessorSchema = z.object({
  withdrawalId: z.uuid("That is not a withdrawal's id."),
  successorVersionId: z.uuid("Choose the version that replaces it."),
  mapping: inputMappingSchema.default(EMPTY_MAPPING),
});

export const withdrawalRefSchema = z.object({ id: z.uuid("That is not a withdrawal's id.") });

export const OUTCOME_IDS = ["no-action", "rerun-checked", "drawings-revised"] as const;
export const OUTCOME_LABELS: Record<(typeof OUTCOME_IDS)[number], string> = {
  "no-action": "No action needed",
  "rerun-checked": "Re-run and re-checked",
  "drawings-revised": "Drawings revised",
};

const optionalText = (what: string, max: number) =>
  plainText()
    .pipe(z.string().trim().max(max, `Keep ${what} under ${max} characters.`))
    .optional()
    .transform((value) => value || undefined);

export const recordOutcomeSchema = z
  .object({
    withdrawalId: z.uuid("That is not a withdrawal's id."),
    revisionId: z.uuid("Choose an affected calc revision."),
    outcome: z.enum(OUTCOME_IDS, { error: "Choose no action needed, re-run and re-checked, or drawings revised." }),
    reason: optionalText("the reason", 1000),
    newRevisionId: optionalId("the new revision that was re-run and re-checked"),
    reference: optionalText("the drawing reference", 300),
  })
  .superRefine((value, context) => {
    if (value.outcome === "no-action" && !value.reason)
      context.addIssue({ code: "custom", path: ["reason"], message: "Say why no action is needed." });
    if (value.outcome === "rerun-checked" && !value.newRevisionId)
      context.addIssue({ code: "custom", path: ["newRevisionId"], message: "Name the revision that was re-run and re-checked." });
    if (value.outcome === "drawings-revised" && !value.reference)
      context.addIssue({ code: "custom", path: ["reference"], message: "Give the revised drawings' numbers and revision." });
  });

export const startBatchSchema = z.object({ withdrawalId: z.uuid("That is not a withdrawal's id.") });

export const batchProgressSchema = z.object({ id: z.uuid("That is not a withdrawal's id.") });
