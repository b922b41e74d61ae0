// Jobs and runs: what an engineer types when creating or changing a job and when running a standard. The same
// schemas validate the forms in the browser and the input on the server. A run's input values are checked
// against the standard's own definition by the evaluation (units, bounds); here only their size and characters.
import { z } from "../zod";
import { plainText } from "./text";

export const JOB_STATUS_IDS = ["active", "on-hold", "closed"] as const;
export type JobStatusId = (typeof JOB_STATUS_IDS)[number];
export const JOB_STATUS_LABELS: Record<JobStatusId, string> = { active: "Active", "on-hold": "On hold", closed: "Closed" };

/** As drawings and calc sheets write it: letters, digits and single hyphens or dots (MF-2291, 24.017). */
export const JOB_NUMBER_PATTERN = /^[A-Za-z0-9]+([-.][A-Za-z0-9]+)*$/;

const optionalText = (what: string, max: number) =>
  plainText()
    .pipe(z.string().trim().max(max, `Keep the ${what} under ${max} characters.`))
    .optional()
    .transform((value) => (value ? value : null));

export const jobFieldsSchema = z.object({
  jobNumber: plainText().pipe(
    z
      .string()
      .trim()
      .min(1, "Give the job number, as the drawings write it.")
      .max(30, "A job number is at most 30 characters.")
      .regex(JOB_NUMBER_PATTERN, "Use letters and digits, joined by single hyphens or dots (e.g. MF-2291)."),
  ),
  name: plainText().pipe(z.string().trim().min(1, "Give the job a name.").max(120, "Keep the name under 120 characters.")),
  client: optionalText("client's name", 120),
  site: optionalText("site", 200),
  responsibleEngineerId: z.string({ error: "Choose the responsible engineer." }).min(1, "Choose the responsible engineer."),
});

export const createJobSchema = jobFieldsSchema;
export const updateJobSchema = jobFieldsSchema.extend({
  jobId: z.uuid("Choose a job."),
  status: z.enum(JOB_STATUS_IDS, { error: "Choose active, on hold or closed." }),
});
export const jobRefSchema = z.object({ jobNumber: z.string().trim().min(1).max(30) });
export const listJobsSchema = z
  .object({
    q: plainText().pipe(z.string().trim().max(100, "Search with fewer than 100 characters.")).optional(),
    status: z.enum(JOB_STATUS_IDS, { error: "Filter by active, on hold or closed." }).optional(),
    limit: z.coerce.number().int().positive().max(500).optional(),
  })
  .default({});

/** A standard may have at most this many inputs given in one run, each at most this long. */
export const MAX_RUN_INPUTS = 200;
export const MAX_INPUT_LENGTH = 200;

export const runInputsSchema = z
  .record(
    z.string().max(64, "An input's name is at most 64 characters."),
    z.union([
      plainText().pipe(z.string().max(MAX_INPUT_LENGTH, `An input's value is at most ${MAX_INPUT_LENGTH} characters.`)),
      z.number().refine(Number.isFinite, "A number must be finite."),
    ]),
  )
  .refine((inputs) => Object.keys(inputs).length <= MAX_RUN_INPUTS, `A run takes at most ${MAX_RUN_INPUTS} inputs.`);

export const UNIT_SYSTEM_IDS = ["si", "us"] as const;
export type UnitSystemId = (typeof UNIT_SYSTEM_IDS)[number];

export const createRunSchema = z.object({
  jobId: z.uuid("Choose the job to run in."),
  versionId: z.uuid("Choose a published version of a standard."),
  inputs: runInputsSchema.default({}),
  unitSystem: z.enum(UNIT_SYSTEM_IDS, { error: "Choose SI or US customary units." }).default("si"),
  parentRunId: z.uuid("The run to re-run is not a run id.").optional(),
});
export type CreateRunInput = z.input<typeof createRunSchema>;

export const runRefSchema = z.object({ id: z.uuid("That is not a run id.") });

/** GET /api/runs and the run log: filters, order and page (lib/domain/schemas/run-log.ts). */
export { runListQuerySchema as listRunsSchema } from "./run-log";

/** A stored calc sheet PDF of a run. */
export const sheetPdfRefSchema = z.object({
  id: z.uuid("That is not a run id."),
  pdfId: z.uuid("That is not a calc sheet PDF's id."),
});

export const ATTACHMENT_MAX_BYTES = 20 * 1024 * 1024;
export const ATTACHMENT_TOO_LARGE = "That file is over 20 MB; scan or export it at a lower resolution, or split it.";
/** Attach a file to a job (runId empty) or to one of its runs. The type is told again from the bytes. */
export const attachFileSchema = z.object({
  jobNumber: z.string().trim().min(1, "Choose a job.").max(30, "That is not a job number."),
  runId: z.union([z.literal(""), z.uuid("That is not a run id.")]).default(""),
  note: optionalText("note", 200),
  file: z
    .file("Choose a file to attach (PDF, PNG, JPEG or WebP).")
    .min(1, "That file is empty.")
    .max(ATTACHMENT_MAX_BYTES, ATTACHMENT_TOO_LARGE)
    .mime(
      ["application/pdf", "image/png", "image/jpeg", "image/webp"],
      "A job takes PDF, PNG, JPEG or WebP files: sketches, site photos, scanned or exported documents.",
    ),
});
export const attachmentRefSchema = z.object({ attachmentId: z.uuid("That is not an attachment's id.") });
export const attachmentPlaceSchema = z.object({
  jobId: z.uuid("That is not a job id."),
  runId: z.uuid("That is not a run id.").nullable().default(null),
});

/** Two runs of the same standard to compare: `a` the earlier or reference run, `b` the other. */
export const compareRunsSchema = z
  .object({
    a: z.uuid("Choose the first run to compare."),
    b: z.uuid("Choose the run to compare it with."),
    /** The units the values are shown in: the person's display units (differences are of the SI values). */
    units: z.enum(UNIT_SYSTEM_IDS, { error: "Choose SI or US customary units." }).default("si"),
  })
  .refine((value) => value.a !== value.b, { message: "Choose two different runs to compare.", path: ["b"] });
