// The parts of a run's trace that are plain records: the version that made it, the engine and the record, the
// outputs as stored, and the audit events about it. Server components; the page puts them in order.
import Link from "next/link";
import type { RunTrace } from "@/lib/use-cases/trace";
import { inOrder, type RunRecord } from "@/lib/standards/run-record";
import { formatSignificant, trimZeros } from "@/lib/standards/format";
import { Badge } from "@/components/ui/badge";
import { TableFrame } from "@/components/ui/table";
import { LocalTime } from "@/components/local-time";
import { AuditSentence } from "@/components/audit-sentence";
import { LibraryEntriesUsed } from "@/components/runs/library-entries-used";
import { VersionStatusBadge } from "../../../../standards/_components/version-status";

const META =
  "grid gap-x-8 gap-y-2 rounded-plate bg-paper-raised p-4 text-sm shadow-sheet ring-1 ring-ink-200 sm:grid-cols-[auto_minmax(0,1fr)]";
const LINK = "text-plate-700 underline underline-offset-2 hover:text-plate-800";

export function TraceVersion({ trace, timeZone }: { trace: RunTrace; timeZone?: string }) {
  const { version, run } = trace;
  const base = `/standards/${version.slug}`;
  const published = version.events.find((event) => event.kind === "published");
  const withdrawn = version.events.findLast((event) => event.kind === "withdrawn");
  return (
    <dl className={META} data-testid="trace-version">
      <dt className="text-ink-500">Standard</dt>
      <dd className="flex flex-wrap items-center gap-2">
        <Link href={`${base}/versions/${version.number}`} className={LINK} data-testid="trace-version-link">
          {version.title} v{version.number}
        </Link>
        <VersionStatusBadge status={version.status} />
      </dd>
      <dt className="text-ink-500">Written by</dt>
      <dd data-testid="trace-author">{version.authorName}</dd>
      <dt className="text-ink-500">Reviewed and approved by</dt>
      <dd data-testid="trace-reviewer">{version.reviewerName}</dd>
      <dt className="text-ink-500">Approved and published</dt>
      <dd data-testid="trace-published">
        <LocalTime iso={published?.occurredAt ?? version.publishedAt} timeZone={timeZone} />
      </dd>
      {withdrawn ? (
        <>
          <dt className="text-fault-700">Withdrawn</dt>
          <dd className="text-fault-700">
            {withdrawn.reason} ({withdrawn.actorName}, <LocalTime iso={withdrawn.occurredAt} timeZone={timeZone} />)
          </dd>
        </>
      ) : null}
      <dt className="text-ink-500">Changelog</dt>
      <dd data-testid="trace-changelog">{version.changelog}</dd>
      <dt className="text-ink-500">Content hash</dt>
      <dd>
        <span className="block font-mono text-xs break-all text-ink-700" data-testid="trace-content-hash">
          sha256:{version.contentHash}
        </span>
        <span data-testid="trace-content-hash-check" data-matches={version.contentHashMatches ? "yes" : "no"}>
          {version.contentHashMatches ? (
            <>
              <Badge tone="pass">matches</Badge>{" "}
              <span className="text-xs text-ink-500">the version&apos;s stored text hashes to the hash the run recorded</span>
            </>
          ) : (
            <>
              <Badge tone="fault">does not match</Badge>{" "}
              <span className="text-xs text-fault-700">
                the version&apos;s stored text does not hash to the hash the run recorded
              </span>
            </>
          )}
        </span>
      </dd>
      <dt className="text-ink-500">Changes</dt>
      <dd className="flex flex-wrap gap-x-4 gap-y-1" data-testid="trace-diffs">
        {version.previous !== null ? (
          <Link
            href={`${base}/diff?from=${version.previous}&to=${version.number}`}
            className={LINK}
            data-testid="trace-diff-previous"
          >
            from v{version.previous} to this version
          </Link>
        ) : (
          <span className="text-ink-500">the first version</span>
        )}
        {version.next !== null ? (
          <Link href={`${base}/diff?from=${version.number}&to=${version.next}`} className={LINK} data-testid="trace-diff-next">
            from this version to v{version.next}
          </Link>
        ) : (
          <span className="text-ink-500">no later version</span>
        )}
      </dd>
      <dt className="text-ink-500">Its runs</dt>
      <dd>
        <Link href={`${base}/versions/${version.number}/runs`} className={LINK} data-testid="trace-version-runs">
          every run of {run.title} v{version.number}
        </Link>
      </dd>
    </dl>
  );
}

export function TraceIdentity({ trace, record, timeZone }: { trace: RunTrace; record: RunRecord; timeZone?: string }) {
  const { run } = trace;
  return (
    <dl className={META} data-testid="trace-identity">
      <dt className="text-ink-500">Frame engine</dt>
      <dd className="font-mono text-xs break-all" data-testid="trace-engine">
        {record.identity.engine} (source sha256:{record.identity.engineSourceHash})
      </dd>
      <dt className="text-ink-500">Evaluation</dt>
      <dd className="font-mono text-xs" data-testid="trace-evaluation">
        {record.identity.evaluation}
      </dd>
      <dt className="text-ink-500">Evaluation bundle</dt>
      <dd className="font-mono text-xs break-all" data-testid="trace-bundle">
        sha256:{record.identity.bundleSha256}
      </dd>
      <dt className="text-ink-500">Run by</dt>
      <dd>
        {run.createdByName}, <LocalTime iso={run.createdAt} timeZone={timeZone} /> ·{" "}
        {record.unitSystem === "us" ? "US customary" : "SI"} units · {record.purpose === "remediation" ? "remediation" : "design"}
      </dd>
      {record.parentRunId ? (
        <>
          <dt className="text-ink-500">Re-run of</dt>
          <dd>
            <Link href={`/runs/${record.parentRunId}/trace`} className={`font-mono ${LINK}`}>
              {record.parentRunId.slice(0, 8)}
            </Link>
          </dd>
        </>
      ) : null}
      {record.libraries.length > 0 ? (
        <>
          <dt className="text-ink-500">Library entries</dt>
          <dd>
            <LibraryEntriesUsed entries={record.libraries} testId="trace-library-entries" wholeHash />
          </dd>
        </>
      ) : null}
      <dt className="text-ink-500">Record</dt>
      <dd className="font-mono text-xs break-all" data-testid="trace-record">
        sha256:{run.recordSha256} ({run.recordBytes.toLocaleString("en")} bytes, RFC 8785 canonical JSON)
      </dd>
    </dl>
  );
}

const si = (value: number) => trimZeros(formatSignificant(value, 6));

/** The extracts and checks as the record keeps them: each value as shown and in SI, each check's utilisation. */
export function TraceOutputs({ record }: { record: Extract<RunRecord, { outcome: "succeeded" }> }) {
  const { evaluation, order } = record;
  return (
    <div className="space-y-4">
      <TableFrame testId="trace-extracts" label="Extracts" headings={["Extract", "Value", "In SI"]}>
        {inOrder(evaluation.extracts, order.extracts).map(([key, value]) => (
          <tr key={key} data-testid="trace-extract" data-key={key}>
            <td className="px-4 py-2 font-mono text-xs">{key}</td>
            <td className="px-4 py-2 tabular">{value.display}</td>
            <td className="px-4 py-2 text-ink-500 tabular">{si(value.si)}</td>
          </tr>
        ))}
      </TableFrame>
      <TableFrame
        testId="trace-checks"
        label="Checks"
        headings={["Check", "Clause", "Demand", "Capacity", "Utilisation", "Result"]}
      >
        {inOrder(evaluation.checks, order.checks).map(([key, check]) => (
          <tr key={key} data-testid="trace-check" data-key={key}>
            <td className="px-4 py-2">
              {check.label} <span className="block font-mono text-xs text-ink-500">{key}</span>
            </td>
            <td className="min-w-[12rem] px-4 py-2 text-ink-700">{check.clause}</td>
            <td className="px-4 py-2 tabular">
              {check.demand} <span className="block text-xs text-ink-500">{si(check.demandSI)} SI</span>
            </td>
            <td className="px-4 py-2 tabular">
              {check.capacity} <span className="block text-xs text-ink-500">{si(check.capacitySI)} SI</span>
            </td>
            <td className="px-4 py-2 tabular" data-testid="trace-utilisation">
              {check.utilisationShown} <span className="block text-xs text-ink-500">{si(check.utilisation)}</span>
            </td>
            <td className="px-4 py-2">
              <Badge tone={check.pass ? "pass" : "fault"}>{check.pass ? "Pass" : "Fail"}</Badge>
            </td>
          </tr>
        ))}
      </TableFrame>
      <p className="text-sm text-ink-700">
        Equilibrium residual {si(evaluation.equilibriumResidual)} · overall{" "}
        <Badge tone={evaluation.pass ? "pass" : "fault"}>{evaluation.pass ? "every check passes" : "a check fails"}</Badge>
      </p>
    </div>
  );
}

export function TraceEvents({ trace, timeZone }: { trace: RunTrace; timeZone?: string }) {
  const showAddress = trace.events.some((event) => event.ipAddress !== null);
  return (
    <>
      {trace.moreEvents ? (
        <p className="mb-2 text-sm text-warn-700">
          Only the newest {trace.events.length} events are shown; the audit trail has them all.
        </p>
      ) : null}
      <TableFrame
        testId="trace-events"
        label="Audit events about this run"
        headings={["When", "What", ...(showAddress ? ["From"] : [])]}
      >
        {trace.events.map((event) => (
          <tr key={event.id} data-testid="trace-event" data-action={event.action}>
            <td className="px-4 py-2 align-top text-ink-700">
              <LocalTime iso={event.occurredAt} timeZone={timeZone} />
            </td>
            <td className="px-4 py-2">
              <AuditSentence event={event} />
              <span className="block text-xs text-ink-500">{event.label}</span>
            </td>
            {showAddress ? <td className="px-4 py-2 font-mono text-xs text-ink-500">{event.ipAddress ?? "—"}</td> : null}
          </tr>
        ))}
      </TableFrame>
    </>
  );
}
