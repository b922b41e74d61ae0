import type { Metadata } from "next";
import Link from "next/link";
import { notFound } from "next/navigation";
import { requirePageActor } from "@/lib/auth/session";
import type { LibraryDocument } from "@/lib/libraries";
import { runUseCase } from "@/lib/use-cases/run";
import { readLibraryVersion } from "@/lib/use-cases/library-reads";
import { PageHeader } from "@/components/ui/page-header";
import { EntryDiff } from "@/components/libraries/entry-diff";
import { orNotFound } from "../../../_components/or-not-found";

export const metadata: Metadata = { title: "Library difference" };

export default async function LibraryDiffPage({ params, searchParams }: PageProps<"/libraries/[slug]/diff">) {
  const { slug } = await params;
  const query = await searchParams;
  const from = Number([query.from].flat()[0]);
  const to = Number([query.to].flat()[0]);
  if (![from, to].every((n) => Number.isInteger(n) && n >= 1) || from === to) notFound();
  const actor = await requirePageActor("libraries.read", {
    next: `/libraries/${encodeURIComponent(slug)}/diff?from=${from}&to=${to}`,
  });
  const [before, after] = await orNotFound(() =>
    Promise.all([
      runUseCase(readLibraryVersion, { actor, input: { slug, number: from } }),
      runUseCase(readLibraryVersion, { actor, input: { slug, number: to } }),
    ]),
  );
  return (
    <>
      <PageHeader
        title={`${after.title}: version ${from} → ${to}`}
        lead="Entries added, removed and changed, each changed value old → new."
        actions={
          <Link href={`/libraries/${slug}/versions/${to}`} className="text-sm font-medium text-plate-800 hover:underline">
            Version {to}
          </Link>
        }
      />
      <EntryDiff
        before={before.document as LibraryDocument}
        after={after.document as LibraryDocument}
        beforeLabel={`version ${from}`}
        afterLabel={`version ${to}`}
      />
    </>
  );
}
