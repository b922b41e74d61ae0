import type { Metadata } from "next";
import { requirePageActor } from "@/lib/auth/session";
import { runUseCase } from "@/lib/use-cases/run";
import { readLibrary, readLibraryVersion } from "@/lib/use-cases/library-reads";
import { PageHeader } from "@/components/ui/page-header";
import { LibraryVersionPage } from "../_components/version-page";
import { orNotFound } from "../../_components/or-not-found";

export const metadata: Metadata = { title: "Library" };

// The library at its current version: the newest that is not withdrawn (what "latest" resolves to).
export default async function LibraryPage({ params }: PageProps<"/libraries/[slug]">) {
  const { slug } = await params;
  const actor = await requirePageActor("libraries.read", { next: `/libraries/${encodeURIComponent(slug)}` });
  const library = await orNotFound(() => runUseCase(readLibrary, { actor, input: { slug } }));
  const current = library.versions.find((version) => version.status !== "withdrawn") ?? library.versions[0];
  if (!current)
    return (
      <PageHeader title={slug} lead="No version of this library is published yet; its draft is listed on the Libraries page." />
    );
  const version = await orNotFound(() => runUseCase(readLibraryVersion, { actor, input: { slug, number: current.number } }));
  return <LibraryVersionPage version={version} history={library.versions} />;
}
