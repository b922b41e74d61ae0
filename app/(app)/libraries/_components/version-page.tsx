// A library version's page: its header (title, kind, number, status, hashes, author and reviewer), what it
// holds, and its place among the library's versions, each with the difference from the one before it.
import Link from "next/link";
import { LIBRARY_KIND_NAMES } from "@/lib/libraries";
import type { LibraryVersionSummaryDto } from "@/lib/data/libraries";
import type { LibraryVersionView } from "@/lib/use-cases/library-reads";
import { PageHeader } from "@/components/ui/page-header";
import { TableFrame } from "@/components/ui/table";
import { formatDate } from "@/components/format-date";
import { LibraryStatusBadge } from "./version-status";
import { VersionContent } from "./version-content";

export function LibraryVersionPage({ version, history }: { version: LibraryVersionView; history: LibraryVersionSummaryDto[] }) {
  const withdrawal = version.events.findLast((event) => event.kind === "withdrawn" && event.entryKey === null);
  return (
    <>
      <PageHeader
        title={version.title}
        lead={`${LIBRARY_KIND_NAMES[version.kind].many} · version ${version.number} · ${version.entries} ${version.entries === 1 ? "entry" : "entries"}`}
        actions={
          <Link href="/libraries" className="text-sm font-medium text-plate-800 hover:underline">
            All libraries
          </Link>
        }
      />
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
    </>
  );
}
