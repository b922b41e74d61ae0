// The calc package: what an engineer types to number a calc, issue a run as a revision of it for checking, check
// it (approve or return with comments), approve it as the job's responsible engineer, and change its issue status.
import { z } from "../zod";
import { plainText } from "./text";

export const ISSUE_STATUS_IDS = ["preliminary", "for-approval", "for-construction", "superseded"] as const;
export type IssueStatusId = (typeof ISSUE_STATUS_IDS)[number];
export const ISSUE_STATUS_LABELS: Record<IssueStatusId, string> = {
  preliminary: "Preliminary",
  "for-approval": "For approval",
  "for-construction": "For construction",
  superseded: "Superseded",
};

const note = (what: string, max = 2000) => plainText().pipe(z.string().trim().max(max, `Keep ${what} under ${max} characters.`));

export const createCalcSchema = z.object({
  jobId: z.uuid("Choose a job."),
  number: plainText().pipe(
    z
      .string()
      .trim()
      .min(1, "Give the calc a number, as drawings cite it (e.g. C-012).")
      .max(20, "A calc number is at most 20 characters.")
      .regex(/^[A-Za-z0-9]+([-.][A-Za-z0-9]+)*$/, "Use letters and digits, joined by single hyphens or dots (e.g. C-012)."),
  ),
  title: plainText().pipe(z.string().trim().min(1, "Say what the calc covers.").max(160, "Keep the title under 160 characters.")),
});

export const prepareRevisionSchema = z.object({
  calcId: z.uuid("Choose the calc this run is a revision of."),
  runId: z.uuid("Choose a run."),
  checkerId: z.string({ error: "Choose who checks it." }).min(1, "Choose who checks it."),
  issueStatus: z.enum(["preliminary", "for-approval", "for-construction"], {
    error: "Choose preliminary, for approval or for construction.",
  }),
  note: note("the note").optional(),
});

export const checkRevisionSchema = z
  .object({
    revisionId: z.uuid("Choose a revision."),
    decision: z.enum(["approve", "return"], { error: "Approve it, or return it with comments." }),
    note: note("the comments").optional(),
  })
  .refine((value) => value.decision === "approve" || (value.note ?? "").length > 0, {
    path: ["note"],
    message: "Say what must change before it can be checked.",
  });

export const approveRevisionSchema = z.object({
  revisionId: z.uuid("Choose a revision."),
  reason: note("the reason", 1000).optional(),
});

export const calcRefSchema = z.object({ jobId: z.uuid("Choose a job.") });
