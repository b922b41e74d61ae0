// A run's trace, the runs of one version, and a reproduction of a stored run.
import { z } from "../zod";
import { versionRefSchema } from "./standards";

export const REPRODUCTION_MODES = ["as-issued", "current"] as const;
export type ReproductionMode = (typeof REPRODUCTION_MODES)[number];

/** "as-issued": with the evaluation bundle that made the run; "current": with the server's bundle of today. */
export const reproduceRunSchema = z.object({
  id: z.uuid("That is not a run id."),
  mode: z.enum(REPRODUCTION_MODES, { error: "Reproduce as issued or with today's bundle." }),
});

export const VERSION_RUNS_PAGE_SIZE = 50;

/** Every run of one published version, newest first, a page at a time (the cursor is the last row shown). */
export const versionRunsSchema = versionRefSchema.extend({
  cursor: z
    .string()
    .regex(/^\d{4}-\d\d-\d\dT[\d:.]+Z_[0-9a-f-]{36}$/, "That page cursor is not one Gusset gave.")
    .optional(),
  limit: z.coerce.number().int().min(1).max(200).default(VERSION_RUNS_PAGE_SIZE),
});
