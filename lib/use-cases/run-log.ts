import "server-only";
// The run log: every run of the firm, filtered, sorted and paged on the server (GET /api/runs, the runs list and the
// auditor's /audit/runs all read through pageOfRuns, one query in lib/data/run-list.ts), and its CSV export. The export
// is a use case like any read — permission checked, filters parsed, an audit event naming the filters — whose
// result is the first batch of rows; the route then streams the rest in keyset batches (run-log-export.ts).
import { z } from "zod";
import {
  directionOf,
  readRunCursor,
  runExportQuerySchema,
  runListParams,
  runListQuerySchema,
  writeRunCursor,
  type RunListQuery,
} from "@/lib/domain/schemas/run-log";
import { nextDay, startOfDayInTimeZone } from "@/lib/domain/zoned-time";
import { cursorAfter, listRuns, type RunFilter, type RunListRowDto } from "@/lib/data/run-list";
import { listJobs } from "@/lib/data/jobs";
import { listVersionSummaries } from "@/lib/data/standards";
import { listAuditPeople } from "@/lib/data/audit";
import { defineUseCase } from "./use-case";

export type RunPage = { runs: RunListRowDto[]; nextCursor: string | null };

/** The data layer's filter for a parsed query: days become instants in the query's time zone. */
export function runFilterOf(query: RunListQuery): Omit<RunFilter, "limit" | "after"> {
  return {
    jobNumber: query.job,
    slug: query.standard,
    number: query.version,
    createdById: query.person,
    outcome: query.outcome,
    pass: query.pass === undefined ? undefined : query.pass === "true",
    signOff: query.signOff,
    from: query.from ? startOfDayInTimeZone(query.from, query.tz) : undefined,
    until: query.to ? startOfDayInTimeZone(nextDay(query.to), query.tz) : undefined,
    sort: query.sort,
    dir: directionOf(query),
  };
}

/** One page of runs for a parsed query, with the cursor of the next page (null on the last). */
export async function pageOfRuns(query: RunListQuery): Promise<RunPage> {
  // The schema has refused a cursor that does not read for the query's order.
  const after = query.cursor ? (readRunCursor(query.cursor, query.sort) ?? undefined) : undefined;
  const rows = await listRuns({ ...runFilterOf(query), after, limit: query.limit + 1 });
  const page = rows.slice(0, query.limit);
  const last = page.at(-1);
  return { runs: page, nextCursor: rows.length > query.limit && last ? writeRunCursor(cursorAfter(last, query.sort)) : null };
}

/** A page of the auditor's run log. */
export const readRunLog = defineUseCase({
  name: "runs.log",
  permission: "run-log.read",
  input: runListQuerySchema,
  run: async (query): Promise<RunPage> => pageOfRuns(query),
  audit: null,
});

export type RunLogOptions = {
  jobs: { jobNumber: string; name: string }[];
  standards: { slug: string; title: string; versions: number[] }[];
  people: { id: string; name: string; email: string; deactivated: boolean }[];
};

/** What the run log's filters offer: the firm's jobs, its standards with their version numbers, and its people. */
export const readRunLogOptions = defineUseCase({
  name: "runs.log.options",
  permission: "run-log.read",
  input: z.object({}).default({}),
  run: async (): Promise<RunLogOptions> => {
    const jobs = (await listJobs())
      .map((job) => ({ jobNumber: job.jobNumber, name: job.name }))
      .sort((a, b) => a.jobNumber.localeCompare(b.jobNumber));
    const standards = new Map<string, RunLogOptions["standards"][number]>();
    for (const version of await listVersionSummaries()) {
      const standard = standards.get(version.slug) ?? { slug: version.slug, title: version.title, versions: [] };
      standard.versions.push(version.number);
      standards.set(version.slug, standard);
    }
    for (const standard of standards.values()) standard.versions.sort((a, b) => a - b);
    return {
      jobs,
      standards: [...standards.values()].sort((a, b) => a.title.localeCompare(b.title)),
      people: await listAuditPeople(),
    };
  },
  audit: null,
});

/** How many rows each query of an export reads: large enough to keep the queries few, small enough to stream. */
export const EXPORT_BATCH = 2000;

export type RunExport = {
  query: RunListQuery;
  /** Rows made after this instant are left out, so that an export started is an export of one moment. */
  asOf: string;
  first: RunListRowDto[];
};

/** Starts a CSV export of what the query filters: its first batch, read in the use case's transaction. */
export const exportRunLog = defineUseCase({
  name: "runs.export",
  permission: "audit.export",
  input: runExportQuerySchema,
  run: async (parsed): Promise<RunExport> => {
    const query = { ...parsed, cursor: undefined };
    const asOf = new Date().toISOString();
    const first = await listRuns({ ...exportFilterOf(query, asOf), limit: EXPORT_BATCH });
    return { query, asOf, first };
  },
  audit: ({ result }) => ({
    action: "runs.export",
    subject: null,
    details: { filters: Object.fromEntries(runListParams({ ...result.query, limit: undefined })), asOf: result.asOf },
  }),
});

/** The export's filter: the query's, ending at `asOf` (the earlier of the two when the query has a last day). */
export function exportFilterOf(query: RunListQuery, asOf: string): Omit<RunFilter, "limit" | "after"> {
  const filter = runFilterOf(query);
  const snapshot = new Date(Date.parse(asOf) + 1);
  return { ...filter, until: filter.until && filter.until < snapshot ? filter.until : snapshot };
}
