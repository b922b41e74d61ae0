import type { Metadata } from "next";
import { requirePageActor } from "@/lib/auth/session";
import { runUseCase } from "@/lib/use-cases/run";
import { can } from "@/lib/domain/permissions";
import { readLibrary, readLibraryVersion } from "@/lib/use-cases/library-reads";
import { PageHeader } from "@/components/ui/page-header";
import { LibraryVersionPage, OpenDrafts } from "../_components/version-page";
import { orNotFound } from "../../_components/or-not-found";

export const metadata: Metadata = { title: "Library" };

// The library at its current version: the newest that is not withdrawn (what "latest" resolves to).
export default async function LibraryPage({ params }: PageProps<"/libraries/[slug]">) {
  const { slug } = await params;
  const actor = await requirePageActor("libraries.read", { next: `/libraries/${encodeURIComponent(slug)}` });
  const library = await orNotFound(() => runUseCase(readLibrary, { actor, input: { slug } }));
  const current = library.versions.find((version) => version.status !== "withdrawn") ?? library.versions[0];
  const maintain = can(actor.role, "libraries.write-draft")
    ? { drafts: library.drafts, withdraw: can(actor.role, "libraries.withdraw"), readsReports: can(actor.role, "runs.read") }
    : null;
  if (!current)
    return (
      <>
        <PageHeader
          title={slug}
          lead="No version of this library is published yet: it is published once its draft is reviewed."
        />
        <OpenDrafts drafts={library.drafts} />
      </>
    );
  const version = await orNotFound(() => runUseCase(readLibraryVersion, { actor, input: { slug, number: current.number } }));
  return <LibraryVersionPage version={version} history={library.versions} maintain={maintain} />;
}
