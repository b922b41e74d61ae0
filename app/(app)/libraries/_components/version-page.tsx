// A library version's page: its header (title, kind, number, status, hashes, author and reviewer), what it
// holds, and its place among the library's versions, each with the difference from the one before it. For an
// admin or lead: the library's open drafts, a new draft from this version, and withdrawing it or one entry.
import Link from "next/link";
import { LIBRARY_KIND_NAMES } from "@/lib/libraries";
import type { LibraryVersionSummaryDto } from "@/lib/data/libraries";
import type { LibraryDraftDto } from "@/lib/data/library-drafts";
import type { LibraryVersionView } from "@/lib/use-cases/library-reads";
import { PageHeader } from "@/components/ui/page-header";
import { TableFrame } from "@/components/ui/table";
import { formatDate } from "@/components/format-date";
import { LibraryStatusBadge } from "./version-status";
import { VersionContent } from "./version-content";
import { StartLibraryDraftButton, WithdrawLibraryForm } from "./maintain-library";

export function LibraryVersionPage({
  version,
  history,
  maintain,
}: {
  version: LibraryVersionView;
  history: LibraryVersionSummaryDto[];
  /** For those who maintain the libraries: the library's open drafts, whether they may withdraw, and read impact reports. */
  maintain: { drafts: LibraryDraftDto[]; withdraw: boolean; readsReports: boolean } | null;
}) {
  const withdrawal = version.events.findLast((event) => event.kind === "withdrawn" && event.entryKey === null);
  const usable = version.status === "withdrawn" ? [] : version.entryRows.filter((row) => row.withdrawn === null);
  return (
    <>
      <PageHeader
        title={version.title}
        lead={`${LIBRARY_KIND_NAMES[version.kind].many} · version ${version.number} · ${version.entries} ${version.entries === 1 ? "entry" : "entries"}`}
        actions={
          <>
            {maintain ? <StartLibraryDraftButton versionId={version.id} number={version.number} /> : null}
            <Link href="/libraries" className="self-center text-sm font-medium text-plate-800 hover:underline">
              All libraries
            </Link>
          </>
        }
      />
      {maintain && maintain.drafts.length > 0 ? <OpenDrafts drafts={maintain.drafts} /> : null}
      <dl className="mb-6 grid gap-x-8 gap-y-2 text-sm sm:grid-cols-[max-content_1fr]" data-testid="library-version-facts">
        <dt className="text-ink-500">Status</dt>
        <dd>
          <LibraryStatusBadge status={version.status} />
          {withdrawal?.reason ? <span className="ml-2 text-ink-700">{withdrawal.reason}</span> : null}
        </dd>
        <dt className="text-ink-500">Content hash</dt>
        <dd className="font-mono text-xs break-all" data-testid="library-content-hash">
          {version.contentHash}
        </dd>
        <dt className="text-ink-500">Written by</dt>
        <dd>{version.authorName}</dd>
        <dt className="text-ink-500">Reviewed and published by</dt>
        <dd>
          {version.reviewerName}, {formatDate(version.publishedAt)}
        </dd>
        <dt className="text-ink-500">Change</dt>
        <dd>{version.changelog}</dd>
      </dl>
      <VersionContent version={version} />
      <section className="mt-10" aria-labelledby="library-history">
        <h2 id="library-history" className="mb-2 text-base font-semibold text-ink-900">
          Versions
        </h2>
        <TableFrame
          testId="library-history"
          label="Versions"
          headings={["Version", "Status", "Change", "Published", "Difference"]}
        >
          {history.map((v) => {
            const previous = history.find((other) => other.number < v.number);
            return (
              <tr key={v.id} data-testid="library-history-row" data-number={v.number}>
                <td className="px-4 py-3 font-mono whitespace-nowrap">
                  <Link href={`/libraries/${v.slug}/versions/${v.number}`} className="text-plate-800 hover:underline">
                    v{v.number}
                  </Link>
                </td>
                <td className="px-4 py-3">
                  <LibraryStatusBadge status={v.status} />
                </td>
                <td className="px-4 py-3 text-ink-700">{v.changelog}</td>
                <td className="px-4 py-3 whitespace-nowrap text-ink-500 tabular">{formatDate(v.publishedAt)}</td>
                <td className="px-4 py-3 whitespace-nowrap">
                  {previous ? (
                    <Link
                      href={`/libraries/${v.slug}/diff?from=${previous.number}&to=${v.number}`}
                      className="text-plate-800 hover:underline"
                    >
                      from v{previous.number}
                    </Link>
                  ) : (
                    <span className="text-ink-500">first version</span>
                  )}
                </td>
              </tr>
            );
          })}
        </TableFrame>
      </section>
      {maintain?.withdraw && usable.length > 0 ? (
        <section className="mt-10 space-y-4" aria-labelledby="library-withdraw" data-testid="library-withdraw">
          <h2 id="library-withdraw" className="text-base font-semibold text-ink-900">
            Withdraw
          </h2>
          {[
            { what: "entry", summary: `Withdraw one entry of version ${version.number}`, keys: usable.map((row) => row.key) },
            { what: "version", summary: `Withdraw the whole of version ${version.number}`, keys: undefined },
          ].map(({ what, summary, keys }) => (
            <details key={what} className="rounded-plate bg-paper-raised p-4 ring-1 ring-ink-200">
              <summary className="cursor-pointer font-medium text-ink-900" data-testid={`open-withdraw-${what}`}>
                {summary}
              </summary>
              <div className="mt-3">
                <WithdrawLibraryForm
                  versionId={version.id}
                  number={version.number}
                  entryKeys={keys}
                  readsReports={maintain.readsReports}
                />
              </div>
            </details>
          ))}
        </section>
      ) : null}
    </>
  );
}

/** The library's drafts still being worked on, each a link to it. */
export function OpenDrafts({ drafts }: { drafts: LibraryDraftDto[] }) {
  return (
    <section className="mb-8" aria-labelledby="library-drafts">
      <h2 id="library-drafts" className="mb-2 text-base font-semibold text-ink-900">
        Drafts
      </h2>
      <ul className="space-y-1 text-sm" data-testid="library-drafts">
        {drafts.map((draft) => (
          <li key={draft.id} data-testid="library-draft">
            <Link href={`/libraries/drafts/${draft.id}`} className="font-medium text-plate-800 hover:underline">
              {draft.slug}
              {draft.basedOnNumber ? ` from version ${draft.basedOnNumber}` : ""}
            </Link>{" "}
            <span className="text-ink-500">
              — {draft.state === "in-review" ? "in review" : "being edited"} by {draft.authorName}
            </span>
          </li>
        ))}
      </ul>
    </section>
  );
}
