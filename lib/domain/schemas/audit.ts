// The audit trail's filters and paging, as the page's search params carry them (a GET form, so it works
// without JavaScript) and as the read use case takes them. Parsing a parsed value again gives the same
// value, so the page can check the address itself and still hand the result to the runner.
import { z } from "../zod";
import { isAuditAction } from "../audit-actions";
import { isTimeZone } from "../zoned-time";

/** An empty field of the form ("Everyone", no date) is no filter. */
export const blankIsAbsent = (value: unknown) => (value === "" || value === null ? undefined : value);

export const isoDay = z
  .string({ error: "Enter one date, as YYYY-MM-DD." })
  .regex(/^\d{4}-\d{2}-\d{2}$/, { message: "Enter a date as YYYY-MM-DD.", abort: true })
  .refine(
    (value) => {
      const date = new Date(`${value}T00:00:00Z`);
      return !Number.isNaN(date.getTime()) && date.toISOString().startsWith(value);
    },
    { message: "That date does not exist.", abort: true },
  )
  .refine((value) => value >= "1970-01-01" && value <= "9998-12-31", "Enter a date between 1970 and 9998.");

const checkbox = z.preprocess(
  (value) => {
    if (value === undefined || value === "" || value === false) return false;
    if (value === true || value === "1" || value === "on") return true;
    return value;
  },
  z.boolean({ error: 'Tick "Show sign-ins" or leave it empty.' }),
);

export const AUDIT_PAGE_SIZE = 50;

export const auditTrailQuerySchema = z
  .object({
    /** The actor's user id, from the list of people. */
    actor: z.preprocess(
      blankIsAbsent,
      z
        .string({ error: "Choose one person from the list." })
        .regex(/^[A-Za-z0-9_-]{1,64}$/, "Choose a person from the list.")
        .optional(),
    ),
    action: z.preprocess(
      blankIsAbsent,
      z.string({ error: "Choose one action from the list." }).refine(isAuditAction, "Choose an action from the list.").optional(),
    ),
    /** First and last day shown, both included, as days in `tz`. */
    from: z.preprocess(blankIsAbsent, isoDay.optional()),
    to: z.preprocess(blankIsAbsent, isoDay.optional()),
    /** Sign-ins and failed sign-ins are hidden unless this is ticked or one of them is the action chosen. */
    signIns: checkbox,
    /** The zone the dates are days in: the browser's, filled in by the form; UTC without JavaScript. */
    tz: z.preprocess(
      blankIsAbsent,
      z.string({ error: "Unknown time zone." }).refine(isTimeZone, "Unknown time zone.").default("UTC"),
    ),
    limit: z.coerce
      .number({ error: "Show between 1 and 200 events a page." })
      .int("Show between 1 and 200 events a page.")
      .min(1, "Show between 1 and 200 events a page.")
      .max(200, "Show between 1 and 200 events a page.")
      .default(AUDIT_PAGE_SIZE),
    /** The id of the last event on the previous page. */
    before: z.preprocess(
      blankIsAbsent,
      z.coerce.number({ error: "That page of the audit trail does not exist." }).int().positive().optional(),
    ),
  })
  .superRefine((query, context) => {
    if (query.from && query.to && query.to < query.from) {
      context.addIssue({ code: "custom", path: ["to"], message: "The last day is before the first day." });
    }
  });
export type AuditTrailQuery = z.infer<typeof auditTrailQuerySchema>;

/** The address of a page of the trail with the same filters (defaults left out, so addresses stay short). */
export function auditTrailHref(query: Partial<AuditTrailQuery>, page: { before?: number } = {}): string {
  const params = new URLSearchParams();
  if (query.actor) params.set("actor", query.actor);
  if (query.action) params.set("action", query.action);
  if (query.from) params.set("from", query.from);
  if (query.to) params.set("to", query.to);
  if (query.signIns) params.set("signIns", "1");
  if ((query.from || query.to) && query.tz && query.tz !== "UTC") params.set("tz", query.tz);
  if (query.limit && query.limit !== AUDIT_PAGE_SIZE) params.set("limit", String(query.limit));
  if (page.before) params.set("before", String(page.before));
  const search = params.toString();
  return search ? `/audit?${search}` : "/audit";
}
