import type { Metadata } from "next";
import Link from "next/link";
import { requirePageActor } from "@/lib/auth/session";
import { can } from "@/lib/domain/permissions";
import {
  RUN_SORTS,
  directionOf,
  runExportHref,
  runListQuerySchema,
  runLogHref,
  type RunListQuery,
  type RunSort,
} from "@/lib/domain/schemas/run-log";
import { runUseCase } from "@/lib/use-cases/run";
import { readProfile } from "@/lib/use-cases/profile";
import { readRunLog, readRunLogOptions, type RunPage } from "@/lib/use-cases/run-log";
import { PageHeader } from "@/components/ui/page-header";
import { EmptyState } from "@/components/ui/empty-state";
import { Notice } from "@/components/ui/notice";
import { buttonClasses } from "@/components/ui/button";
import { RunTable } from "../../runs/_components/run-table";
import { RunLogFilters, type RunLogFilterErrors, type RunLogFilterValues } from "./_components/run-log-filters";

export const metadata: Metadata = { title: "Run log" };

/** How the message names a filter the address got wrong. */
const FILTER_NAMES: Record<keyof RunLogFilterErrors, string> = {
  job: "Job number",
  standard: "Standard",
  version: "Version",
  person: "Run by",
  outcome: "Frame engine",
  pass: "Checks",
  signOff: "Sign-off",
  from: "From",
  to: "To",
  tz: "Time zone",
  sort: "Order",
  dir: "Direction",
  cursor: "Page",
  limit: "Runs a page",
};

/** One value of a search param as the form shows it back (a repeated param shows its first). */
function shown(value: string | string[] | undefined): string {
  return Array.isArray(value) ? (value[0] ?? "") : (value ?? "");
}

function valuesOf(query: RunListQuery): RunLogFilterValues {
  return {
    job: query.job ?? "",
    standard: query.standard ?? "",
    version: query.version ? String(query.version) : "",
    person: query.person ?? "",
    outcome: query.outcome ?? "",
    pass: query.pass ?? "",
    signOff: query.signOff ?? "",
    from: query.from ?? "",
    to: query.to ?? "",
    sort: query.sort === "date" ? "" : query.sort,
    dir: query.dir ?? "",
  };
}

export default async function RunLogPage({ searchParams }: PageProps<"/audit/runs">) {
  const actor = await requirePageActor("run-log.read", { next: "/audit/runs" });
  const raw = await searchParams;
  // The address is checked here, so that a bad filter is a message on the page rather than an error page.
  const parsed = runListQuerySchema.safeParse(raw);
  const errors: RunLogFilterErrors = {};
  if (!parsed.success)
    for (const issue of parsed.error.issues) {
      const field = String(issue.path[0] ?? "cursor") as keyof RunLogFilterErrors;
      errors[field] ??= issue.message;
    }
  const values: RunLogFilterValues = parsed.success
    ? valuesOf(parsed.data)
    : (Object.fromEntries(
        ["job", "standard", "version", "person", "outcome", "pass", "signOff", "from", "to", "sort", "dir"].map((key) => [
          key,
          shown(raw[key]),
        ]),
      ) as RunLogFilterValues);
  // One after another: each use case is its own transaction on the one pool.
  const options = await runUseCase(readRunLogOptions, { actor, input: {} });
  const timeZone = (await runUseCase(readProfile, { actor, input: {} })).timeZone ?? undefined;
  const page = parsed.success ? await runUseCase(readRunLog, { actor, input: parsed.data }) : null;

  return (
    <>
      <PageHeader
        title="Run log"
        lead="Every run the firm has stored, with how far its calc is signed off: filter by job, standard, version, person, result, sign-off and dates. The address holds the filters, so a list can be shared and opened again."
        actions={
          parsed.success && can(actor.role, "audit.export") ? (
            <a href={runExportHref(parsed.data)} download className={buttonClasses("secondary")} data-testid="run-log-export">
              Download CSV
            </a>
          ) : null
        }
      />
      {/* Keyed by the query, so that a new address (a heading's order, "Clear") shows its own values in the form. */}
      <RunLogFilters key={JSON.stringify(values)} values={values} errors={errors} options={options} timeZone={timeZone} />
      {page && parsed.success ? (
        <RunLogResults query={parsed.data} page={page} linkRuns={can(actor.role, "runs.read")} timeZone={timeZone} />
      ) : (
        <Notice tone="fault" title="These filters cannot be used" testId="run-log-filter-error">
          <ul className="list-disc pl-5">
            {Object.entries(errors).map(([field, message]) => (
              <li key={field}>
                {FILTER_NAMES[field as keyof RunLogFilterErrors] ?? field} “{shown(raw[field])}”: {message}
              </li>
            ))}
          </ul>
          <p className="mt-1">Correct them above, or clear the filters to see every run.</p>
        </Notice>
      )}
    </>
  );
}

function RunLogResults({
  query,
  page,
  linkRuns,
  timeZone,
}: {
  query: RunListQuery;
  page: RunPage;
  linkRuns: boolean;
  timeZone?: string;
}) {
  const dir = directionOf(query);
  // Each heading's link: the same filters in that order, from the first page; the order shown already turns round.
  const hrefs = Object.fromEntries(
    RUN_SORTS.map((sort) => [
      sort,
      runLogHref({ ...query, cursor: undefined, sort, dir: sort === query.sort ? (dir === "asc" ? "desc" : "asc") : undefined }),
    ]),
  ) as Record<RunSort, string>;
  const filtered = Boolean(
    query.job ||
    query.standard ||
    query.version ||
    query.person ||
    query.outcome ||
    query.pass ||
    query.signOff ||
    query.from ||
    query.to,
  );
  return (
    <>
      {page.runs.length === 0 ? (
        <EmptyState
          title={query.cursor ? "No more runs" : filtered ? "No run matches these filters" : "No runs yet"}
          testId="run-log-none"
        >
          {filtered
            ? "Widen the dates or clear a filter."
            : "Runs appear here as engineers run the firm's standards inside jobs."}
        </EmptyState>
      ) : (
        <RunTable
          runs={page.runs}
          showSignOff
          linkRuns={linkRuns}
          timeZone={timeZone}
          sorting={{ sort: query.sort, dir, hrefs }}
        />
      )}
      <nav aria-label="Pages of the run log" className="mt-4 flex flex-wrap items-center gap-4 text-sm">
        <span className="text-ink-500" data-testid="run-log-count">
          {page.runs.length === 0 ? "" : `${page.runs.length} run${page.runs.length === 1 ? "" : "s"} on this page`}
        </span>
        {query.cursor ? (
          <Link
            href={runLogHref({ ...query, cursor: undefined })}
            className="text-plate-700 hover:underline"
            data-testid="run-log-first"
          >
            First page
          </Link>
        ) : null}
        {page.nextCursor ? (
          <Link
            href={runLogHref(query, { cursor: page.nextCursor })}
            className="text-plate-700 hover:underline"
            data-testid="run-log-next"
          >
            Next page
          </Link>
        ) : null}
      </nav>
    </>
  );
}
