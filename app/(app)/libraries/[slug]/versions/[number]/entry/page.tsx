import type { Metadata } from "next";
import Link from "next/link";
import { notFound } from "next/navigation";
import { requirePageActor } from "@/lib/auth/session";
import { can } from "@/lib/domain/permissions";
import { findEntry, type LibraryDocument } from "@/lib/libraries";
import { runUseCase } from "@/lib/use-cases/run";
import { readLibraryVersion } from "@/lib/use-cases/library-reads";
import { PageHeader } from "@/components/ui/page-header";
import { Notice } from "@/components/ui/notice";
import { SectionDrawing } from "@/components/libraries/section-drawing";
import { SectionProperties } from "@/components/libraries/section-properties";
import { sectionOfEntry } from "@/components/libraries/format";
import { orNotFound } from "../../../../../_components/or-not-found";
import { WithdrawLibraryForm } from "../../../../_components/maintain-library";

export const metadata: Metadata = { title: "Section" };

// One section of a library version: drawn to scale with its dimensions, its properties (the catalogue's
// beside the builder's where it lists them), and the entry's hash a run records.
export default async function LibraryEntryPage({ params, searchParams }: PageProps<"/libraries/[slug]/versions/[number]/entry">) {
  const { slug, number: raw } = await params;
  const key = [(await searchParams).key].flat()[0]?.slice(0, 100) ?? "";
  const number = Number(raw);
  if (!Number.isInteger(number) || number < 1 || key === "") notFound();
  const actor = await requirePageActor("libraries.read", {
    next: `/libraries/${encodeURIComponent(slug)}/versions/${number}/entry?key=${encodeURIComponent(key)}`,
  });
  const version = await orNotFound(() => runUseCase(readLibraryVersion, { actor, input: { slug, number } }));
  const document = version.document as LibraryDocument;
  if (document.kind !== "sections") notFound();
  const entry = findEntry(document, key);
  if (!entry) notFound();
  const row = version.entryRows.find((r) => r.key === entry.key);
  const withdrawn = version.status === "withdrawn" ? "its version is withdrawn" : row?.withdrawn?.reason;
  const listed = Object.keys(entry.listed).length > 0;
  const section = sectionOfEntry(entry);
  return (
    <>
      <PageHeader
        title={entry.key}
        lead={`${version.title}, version ${version.number}${entry.origin.from === "catalogue" ? `: row ${entry.origin.row} of the catalogue` : ": made in the section builder"}`}
        actions={
          <Link href={`/libraries/${slug}/versions/${number}`} className="text-sm font-medium text-plate-800 hover:underline">
            Back to the library
          </Link>
        }
      />
      {withdrawn ? (
        <Notice tone="fault" testId="entry-withdrawn">
          Withdrawn, not to be used in a new run: {withdrawn}.
        </Notice>
      ) : null}
      <div className="grid items-start gap-8 lg:grid-cols-[minmax(0,26rem)_minmax(0,1fr)]">
        <SectionDrawing section={section} name={entry.key} />
        <div className="min-w-0">
          <SectionProperties section={section} listed={listed ? entry.listed : undefined} label={`Properties of ${entry.key}`} />
          <p className="mt-4 text-xs text-ink-500">
            Entry hash{" "}
            <span className="font-mono break-all" data-testid="entry-hash">
              {row?.entryHash}
            </span>
            {listed ? " · Where the catalogue lists a value, runs use it; the builder's is shown beside it." : null}
          </p>
          {entry.note ? <p className="mt-2 text-sm text-ink-700">{entry.note}</p> : null}
        </div>
      </div>
      {!withdrawn && row && can(actor.role, "libraries.withdraw") ? (
        <section className="mt-10 space-y-3" aria-labelledby="entry-withdraw">
          <h2 id="entry-withdraw" className="text-base font-semibold text-ink-900">
            Withdraw {entry.key} from version {version.number}
          </h2>
          <WithdrawLibraryForm
            versionId={version.id}
            number={version.number}
            entryKeys={[row.key]}
            readsReports={can(actor.role, "runs.read")}
          />
        </section>
      ) : null}
    </>
  );
}
