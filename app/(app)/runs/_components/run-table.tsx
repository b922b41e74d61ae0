import Link from "next/link";
import type { RunSummaryDto } from "@/lib/data/runs";
import { displayUtilisation } from "@/lib/standards/utilisation";
import { TableFrame } from "@/components/ui/table";
import { LocalTime } from "@/components/local-time";
import { RunOutcomeBadge } from "./run-outcome";

/** Runs newest first: when, which standard and version, who, and how it came out. */
export function RunTable({ runs, showJob = true, timeZone }: { runs: RunSummaryDto[]; showJob?: boolean; timeZone?: string }) {
  return (
    <TableFrame
      testId="runs-table"
      label="Runs"
      headings={[...(showJob ? ["Job"] : []), "Run", "Standard", "By", "Result", "Largest utilisation"]}
    >
      {runs.map((run) => (
        <tr key={run.id} data-testid="run-row" data-run-id={run.id}>
          {showJob ? (
            <td className="px-4 py-3 font-mono text-sm whitespace-nowrap">
              <Link href={`/jobs/${encodeURIComponent(run.jobNumber)}`} className="text-plate-800 hover:underline">
                {run.jobNumber}
              </Link>
            </td>
          ) : null}
          <td className="px-4 py-3 whitespace-nowrap">
            <Link href={`/runs/${run.id}`} className="font-mono text-sm text-plate-800 hover:underline" data-testid="run-link">
              {run.id.slice(0, 8)}
            </Link>
            <span className="block text-xs text-ink-500">
              <LocalTime iso={run.createdAt} timeZone={timeZone} />
            </span>
          </td>
          <td className="px-4 py-3">
            {run.title} <span className="font-mono text-xs text-ink-500">v{run.number}</span>
            {run.purpose === "remediation" ? <span className="block text-xs text-warn-700">Remediation re-run</span> : null}
            {run.withdrawn ? (
              <span className="block text-xs font-semibold text-fault-700" data-testid="run-withdrawn">
                Withdrawn: do not rely on it
              </span>
            ) : null}
          </td>
          <td className="px-4 py-3 text-ink-700">{run.createdByName}</td>
          <td className="px-4 py-3">
            <RunOutcomeBadge outcome={run.outcome} pass={run.pass} />
          </td>
          <td className="px-4 py-3 text-ink-700 tabular">
            {run.maxUtilisation === null ? "—" : displayUtilisation(run.maxUtilisation)}
          </td>
        </tr>
      ))}
    </TableFrame>
  );
}
