import type { Metadata } from "next";
import Link from "next/link";
import { requirePageActor } from "@/lib/auth/session";
import { can } from "@/lib/domain/permissions";
import { LIBRARY_KIND_NAMES, LIBRARY_KINDS } from "@/lib/libraries";
import { runUseCase } from "@/lib/use-cases/run";
import { listLibraries } from "@/lib/use-cases/library-reads";
import { PageHeader } from "@/components/ui/page-header";
import { EmptyState } from "@/components/ui/empty-state";
import { TableFrame } from "@/components/ui/table";
import { buttonClasses } from "@/components/ui/button";
import { formatDate } from "@/components/format-date";
import { LibraryStatusBadge } from "../_components/version-status";
import { OpenDrafts } from "../_components/version-page";

export const metadata: Metadata = { title: "Libraries" };

const KIND_LEADS = {
  sections: "Section properties computed from dimensions, or the firm's catalogue checked against them.",
  materials: "Moduli, densities and strengths, each value with the standard it comes from.",
  combinations: "Load-combination sets: the factors each standard applies to each kind of load.",
} as const;

export default async function LibrariesPage() {
  const actor = await requirePageActor("libraries.read", { next: "/libraries" });
  const { libraries, drafts } = await runUseCase(listLibraries, { actor, input: {} });
  const edits = can(actor.role, "libraries.write-draft");

  return (
    <>
      <PageHeader
        title="Libraries"
        lead="The firm's sections, materials and load-combination sets. Each is published in numbered versions after a second person's review, and every run records the entries it used with their hashes."
        actions={
          <>
            <Link href="/libraries/builder" className={buttonClasses("secondary")} data-testid="open-section-builder">
              Section builder
            </Link>
            {edits ? (
              <Link href="/libraries/new" className={buttonClasses()} data-testid="new-library">
                New library
              </Link>
            ) : null}
          </>
        }
      />
      {edits && drafts.length > 0 ? <OpenDrafts drafts={drafts} /> : null}
      {libraries.length === 0 ? (
        <EmptyState title="No libraries yet">
          {edits
            ? "A library is published like a standard: drafted, reviewed by a second person, then published."
            : "Admins and standards leads publish the firm's libraries here."}
        </EmptyState>
      ) : (
        LIBRARY_KINDS.map((kind) => {
          const ofKind = libraries.filter((library) => library.kind === kind);
          if (ofKind.length === 0) return null;
          return (
            <section key={kind} className="mb-10" aria-labelledby={`kind-${kind}`} data-testid="library-kind" data-kind={kind}>
              <h2 id={`kind-${kind}`} className="text-lg font-semibold text-ink-900">
                {LIBRARY_KIND_NAMES[kind].many}
              </h2>
              <p className="mb-3 text-sm text-ink-700">{KIND_LEADS[kind]}</p>
              <TableFrame
                testId="libraries-table"
                label={LIBRARY_KIND_NAMES[kind].many}
                headings={["Library", "Version", "Entries", "Published"]}
              >
                {ofKind.map(({ slug, current, versions }) => (
                  <tr key={slug} data-testid="library-row" data-slug={slug}>
                    <td className="px-4 py-3">
                      <Link
                        href={`/libraries/${slug}`}
                        className="font-medium text-plate-800 hover:underline"
                        data-testid="library-link"
                      >
                        {current?.title ?? slug}
                      </Link>
                      <p className="font-mono text-xs text-ink-500">{slug}</p>
                    </td>
                    <td className="px-4 py-3 whitespace-nowrap tabular">
                      {current ? (
                        <>
                          <span className="mr-2 font-mono">v{current.number}</span>
                          <LibraryStatusBadge status={current.status} />
                          {versions > 1 ? <span className="ml-2 text-xs text-ink-500">of {versions}</span> : null}
                        </>
                      ) : (
                        <span className="text-ink-500">not yet published</span>
                      )}
                    </td>
                    <td className="px-4 py-3 tabular">{current?.entries ?? "—"}</td>
                    <td className="px-4 py-3 whitespace-nowrap text-ink-500 tabular">
                      {current ? formatDate(current.publishedAt) : "—"}
                    </td>
                  </tr>
                ))}
              </TableFrame>
            </section>
          );
        })
      )}
    </>
  );
}
