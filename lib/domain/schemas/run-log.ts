// The filters, order and page of a list of runs, as GET /api/runs, the auditor's run log (/audit/runs) and its CSV
// export take them from the address: the same schema everywhere, so a page can be shared, reloaded and exported as it
// is. A blank field of the form is no filter. Parsing a parsed value again gives the same value (the page checks the
// address itself and still hands the value to the runner); the cursor stays the text Gusset gave and is read with
// `readRunCursor`.
import { z } from "../zod";
import { blankIsAbsent, isoDay } from "./audit";
import { isTimeZone } from "../zoned-time";

export const RUN_PAGE_SIZE = 50;

/** How far a run's calc has been signed off: the furthest step of any calc revision that issued it. */
export const SIGN_OFF_STATES = ["not-issued", "prepared", "checked", "approved"] as const;
export type SignOffState = (typeof SIGN_OFF_STATES)[number];
export const SIGN_OFF_LABELS: Record<SignOffState, string> = {
  "not-issued": "Not issued",
  prepared: "Prepared",
  checked: "Checked",
  approved: "Approved",
};

export const RUN_SORTS = ["date", "utilisation", "job"] as const;
export type RunSort = (typeof RUN_SORTS)[number];
export type SortDirection = "asc" | "desc";
/** Newest first, the largest utilisation first, job numbers A to Z: what a reader asking for each order expects. */
export const DEFAULT_DIRECTION: Record<RunSort, SortDirection> = { date: "desc", utilisation: "desc", job: "asc" };

/** As Date.toISOString writes an instant (and so Gusset's cursors): to the millisecond, in UTC. */
const ISO_INSTANT = /^\d{4}-\d\d-\d\dT\d\d:\d\d:\d\d\.\d{3}Z$/;
const UUID = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/;

/** Where the next page starts: the last row of the previous one, by the order's own key, its time and its id. */
export type RunCursor =
  | { sort: "date"; createdAt: string; id: string }
  | { sort: "utilisation"; key: number | null; createdAt: string; id: string }
  | { sort: "job"; key: string; createdAt: string; id: string };

/**
 * `<ISO time>_<id>` when sorted by date (the form GET /api/runs has always given), `u<utilisation or none>_<time>_<id>`
 * by utilisation, `j<job number>_<time>_<id>` by job (a job number holds no underscore).
 */
export function writeRunCursor(cursor: RunCursor): string {
  const tail = `${cursor.createdAt}_${cursor.id}`;
  if (cursor.sort === "date") return tail;
  if (cursor.sort === "utilisation") return `u${cursor.key === null ? "none" : String(cursor.key)}_${tail}`;
  return `j${cursor.key}_${tail}`;
}

/** The cursor, or null when it is not one Gusset gave for this order. */
export function readRunCursor(text: string, sort: RunSort): RunCursor | null {
  const parts = text.split("_");
  const id = parts.pop() ?? "";
  const createdAt = parts.pop() ?? "";
  // A day that does not exist (February 30th) would be rolled over by Date: it must read back as it was written.
  if (!UUID.test(id) || !ISO_INSTANT.test(createdAt) || Number.isNaN(Date.parse(createdAt))) return null;
  if (new Date(createdAt).toISOString() !== createdAt) return null;
  const key = parts.join("_");
  if (sort === "date") return key === "" ? { sort, createdAt, id } : null;
  if (sort === "utilisation") {
    if (key === "unone") return { sort, key: null, createdAt, id };
    const value = key.startsWith("u") && /^-?\d+(\.\d+)?(e[-+]?\d+)?$/i.test(key.slice(1)) ? Number(key.slice(1)) : NaN;
    return Number.isFinite(value) ? { sort, key: value, createdAt, id } : null;
  }
  return key.startsWith("j") && /^j[A-Za-z0-9.-]{1,30}$/.test(key) ? { sort, key: key.slice(1), createdAt, id } : null;
}

const optionalText = (max: number, message: string) =>
  z.preprocess(blankIsAbsent, z.string({ error: message }).trim().min(1).max(max, message).optional());

export const runListQuerySchema = z
  .object({
    /** The job number. */
    job: optionalText(30, "A job number is at most 30 characters."),
    /** The standard's short name (its slug). */
    standard: optionalText(60, "A standard's short name is at most 60 characters."),
    /** The version number (of the standard, when one is named). */
    version: z.preprocess(
      blankIsAbsent,
      z.coerce
        .number({ error: "A version is a whole number from 1." })
        .int("A version is a whole number from 1.")
        .min(1, "A version is a whole number from 1.")
        .max(1_000_000, "A version is a whole number from 1.")
        .optional(),
    ),
    /** Who ran it: their user id. */
    person: z.preprocess(
      blankIsAbsent,
      z
        .string({ error: "Choose one person from the list." })
        .regex(/^[A-Za-z0-9_-]{1,100}$/, "Choose a person from the list.")
        .optional(),
    ),
    /** The frame engine's outcome: analysed, or refused (an unstable model). */
    outcome: z.preprocess(blankIsAbsent, z.enum(["succeeded", "failed"], { error: "Filter by succeeded or failed." }).optional()),
    pass: z.preprocess(blankIsAbsent, z.enum(["true", "false"], { error: "Filter by pass (true) or fail (false)." }).optional()),
    signOff: z.preprocess(
      blankIsAbsent,
      z.enum(SIGN_OFF_STATES, { error: "Filter by not-issued, prepared, checked or approved." }).optional(),
    ),
    /** First and last day, both included, as days in `tz`. */
    from: z.preprocess(blankIsAbsent, isoDay.optional()),
    to: z.preprocess(blankIsAbsent, isoDay.optional()),
    tz: z.preprocess(
      blankIsAbsent,
      z.string({ error: "Unknown time zone." }).refine(isTimeZone, "Unknown time zone.").default("UTC"),
    ),
    sort: z.preprocess(blankIsAbsent, z.enum(RUN_SORTS, { error: "Sort by date, utilisation or job." }).default("date")),
    dir: z.preprocess(blankIsAbsent, z.enum(["asc", "desc"], { error: "Sort asc or desc." }).optional()),
    /** The last row of the previous page, as Gusset wrote it (writeRunCursor). */
    cursor: z.preprocess(blankIsAbsent, z.string({ error: "That page cursor is not one Gusset gave." }).max(200).optional()),
    limit: z.preprocess(
      blankIsAbsent,
      z.coerce
        .number({ error: "Show between 1 and 200 runs a page." })
        .int("Show between 1 and 200 runs a page.")
        .min(1, "Show between 1 and 200 runs a page.")
        .max(200, "Show between 1 and 200 runs a page.")
        .default(RUN_PAGE_SIZE),
    ),
  })
  .superRefine((query, context) => {
    if (query.from && query.to && query.to < query.from)
      context.addIssue({ code: "custom", path: ["to"], message: "The last day is before the first day." });
    if (query.cursor !== undefined && !readRunCursor(query.cursor, query.sort))
      context.addIssue({ code: "custom", path: ["cursor"], message: "That page cursor is not one Gusset gave for this order." });
  });
export type RunListQuery = z.infer<typeof runListQuerySchema>;

/** The query without its page: what a CSV export takes. */
export const runExportQuerySchema = runListQuerySchema;

export const directionOf = (query: Pick<RunListQuery, "sort" | "dir">): SortDirection =>
  query.dir ?? DEFAULT_DIRECTION[query.sort];

/** The filters named in a query (blank ones and the defaults left out), in a stable order, for addresses and events. */
export function runListParams(query: Partial<RunListQuery>, page: { cursor?: string | null } = {}): URLSearchParams {
  const params = new URLSearchParams();
  for (const key of ["job", "standard", "version", "person", "outcome", "pass", "signOff", "from", "to"] as const) {
    const value = query[key];
    if (value !== undefined && value !== "") params.set(key, String(value));
  }
  if ((query.from || query.to) && query.tz && query.tz !== "UTC") params.set("tz", query.tz);
  const sort = query.sort || "date"; // a blank order (the form's hidden field) is the default one
  if (sort !== "date") params.set("sort", sort);
  if (query.dir && query.dir !== DEFAULT_DIRECTION[sort]) params.set("dir", query.dir);
  if (query.limit && query.limit !== RUN_PAGE_SIZE) params.set("limit", String(query.limit));
  if (page.cursor) params.set("cursor", page.cursor);
  return params;
}

/** The run log's address for a query (and a page of it). */
export function runLogHref(query: Partial<RunListQuery>, page: { cursor?: string | null } = {}): string {
  const search = runListParams(query, page).toString();
  return search ? `/audit/runs?${search}` : "/audit/runs";
}

/** The CSV export's address for the same filters and order (no page: it holds every row). */
export function runExportHref(query: Partial<RunListQuery>): string {
  const { limit: _limit, cursor: _cursor, ...filters } = query;
  const search = runListParams(filters).toString();
  return search ? `/api/runs/export?${search}` : "/api/runs/export";
}
