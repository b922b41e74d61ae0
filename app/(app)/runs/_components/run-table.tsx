"use client";
// Runs as a table (TanStack Table): when, which standard and version, who, how it came out and, in the run log, how
// far its calc is signed off. The rows come sorted, filtered and paged from the server (a million runs never reach the
// browser), so the table sorts nothing itself: a sortable heading is a link to the same list in another order.
import Link from "next/link";
import { flexRender, getCoreRowModel, useReactTable, type ColumnDef } from "@tanstack/react-table";
import type { RunSummaryDto } from "@/lib/data/runs";
import { SIGN_OFF_LABELS, type RunSort, type SignOffState, type SortDirection } from "@/lib/domain/schemas/run-log";
import { displayUtilisation } from "@/lib/standards/utilisation";
import { TableFrame, type Heading } from "@/components/ui/table";
import { Badge } from "@/components/ui/badge";
import { LocalTime } from "@/components/local-time";
import { RunOutcomeBadge } from "./run-outcome";

type Row = RunSummaryDto & { signOff?: SignOffState };

/** The list's order and, for each order a heading offers, the address of the list sorted so. */
export type ServerSorting = { sort: RunSort; dir: SortDirection; hrefs: Record<RunSort, string> };

type Options = { showJob: boolean; showSignOff: boolean; linkRuns: boolean; timeZone?: string };

const SIGN_OFF_TONES = { "not-issued": "neutral", prepared: "warn", checked: "plate", approved: "pass" } as const;

function columnsFor({ showJob, showSignOff, linkRuns, timeZone }: Options): ColumnDef<Row>[] {
  const columns: (ColumnDef<Row> & { meta: { label: string; sort?: RunSort; className: string } })[] = [
    {
      id: "job",
      meta: { label: "Job", sort: "job", className: "font-mono text-sm whitespace-nowrap" },
      cell: ({ row: { original: run } }) =>
        linkRuns ? (
          <Link href={`/jobs/${encodeURIComponent(run.jobNumber)}`} className="text-plate-800 hover:underline">
            {run.jobNumber}
          </Link>
        ) : (
          <span title={run.jobName}>{run.jobNumber}</span>
        ),
    },
    {
      id: "run",
      meta: { label: "Run", sort: "date", className: "whitespace-nowrap" },
      cell: ({ row: { original: run } }) => (
        <>
          {linkRuns ? (
            <Link href={`/runs/${run.id}`} className="font-mono text-sm text-plate-800 hover:underline" data-testid="run-link">
              {run.id.slice(0, 8)}
            </Link>
          ) : (
            <span className="font-mono text-sm text-ink-900" data-testid="run-id">
              {run.id.slice(0, 8)}
            </span>
          )}
          <span className="block text-xs text-ink-500">
            <LocalTime iso={run.createdAt} timeZone={timeZone} />
          </span>
        </>
      ),
    },
    {
      id: "standard",
      meta: { label: "Standard", className: "" },
      cell: ({ row: { original: run } }) => (
        <>
          {run.title} <span className="font-mono text-xs text-ink-500">v{run.number}</span>
          {run.purpose === "remediation" ? <span className="block text-xs text-warn-700">Remediation re-run</span> : null}
          {run.withdrawn ? (
            <span className="block text-xs font-semibold text-fault-700" data-testid="run-withdrawn">
              Withdrawn: do not rely on it
            </span>
          ) : null}
        </>
      ),
    },
    {
      id: "by",
      meta: { label: "By", className: "text-ink-700" },
      cell: ({ row: { original: run } }) => run.createdByName,
    },
    {
      id: "result",
      meta: { label: "Result", className: "" },
      cell: ({ row: { original: run } }) => <RunOutcomeBadge outcome={run.outcome} pass={run.pass} />,
    },
    {
      id: "utilisation",
      meta: { label: "Largest utilisation", sort: "utilisation", className: "text-ink-700 tabular" },
      cell: ({ row: { original: run } }) => (run.maxUtilisation === null ? "—" : displayUtilisation(run.maxUtilisation)),
    },
    {
      id: "signOff",
      meta: { label: "Sign-off", className: "whitespace-nowrap" },
      cell: ({ row: { original: run } }) =>
        run.signOff ? (
          <Badge tone={SIGN_OFF_TONES[run.signOff]} testId="run-sign-off">
            {SIGN_OFF_LABELS[run.signOff]}
          </Badge>
        ) : null,
    },
  ];
  return columns.filter((c) => (c.id !== "job" || showJob) && (c.id !== "signOff" || showSignOff));
}

type ColumnMeta = { label: string; sort?: RunSort; className: string };

/** A heading that sorts: a link to the list in this order (the other way round when it is the order already). */
function sortHeading(meta: ColumnMeta, sorting: ServerSorting): Heading {
  const sort = meta.sort!;
  const active = sorting.sort === sort;
  const direction = active ? (sorting.dir === "asc" ? "ascending" : "descending") : "none";
  return {
    label: meta.label,
    sort: direction,
    content: (
      <Link
        href={sorting.hrefs[sort]}
        className={`inline-flex items-center gap-1 rounded-plate uppercase hover:text-ink-900 ${active ? "text-ink-900" : ""}`}
        data-testid={`sort-${sort}`}
        scroll={false}
      >
        {meta.label}
        <span aria-hidden="true">{direction === "ascending" ? "▲" : direction === "descending" ? "▼" : "↕"}</span>
        <span className="sr-only">{direction === "none" ? ", sort by this" : `, sorted ${direction}; sort the other way`}</span>
      </Link>
    ),
  };
}

export function RunTable({
  runs,
  showJob = true,
  showSignOff = false,
  linkRuns = true,
  timeZone,
  sorting,
}: {
  runs: Row[];
  showJob?: boolean;
  showSignOff?: boolean;
  /** False for a reader who may not open runs (an admin reading the run log): ids and job numbers as text. */
  linkRuns?: boolean;
  timeZone?: string;
  sorting?: ServerSorting;
}) {
  // TanStack Table hands back a new table object each render by design; nothing here memoises on it.
  // eslint-disable-next-line react-hooks/incompatible-library
  const table = useReactTable({
    data: runs,
    columns: columnsFor({ showJob, showSignOff, linkRuns, timeZone }),
    getCoreRowModel: getCoreRowModel(),
    getRowId: (run) => run.id,
    manualSorting: true,
  });
  const headings = table.getFlatHeaders().map((header): Heading => {
    const meta = header.column.columnDef.meta as ColumnMeta;
    return sorting && meta.sort ? sortHeading(meta, sorting) : meta.label;
  });
  return (
    <TableFrame testId="runs-table" label="Runs" headings={headings}>
      {table.getRowModel().rows.map((row) => (
        <tr key={row.id} data-testid="run-row" data-run-id={row.id}>
          {row.getVisibleCells().map((cell) => (
            <td key={cell.id} className={`px-4 py-3 ${(cell.column.columnDef.meta as ColumnMeta).className}`}>
              {flexRender(cell.column.columnDef.cell, cell.getContext())}
            </td>
          ))}
        </tr>
      ))}
    </TableFrame>
  );
}
