import type { Metadata } from "next";
import { notFound } from "next/navigation";
import { requirePageActor } from "@/lib/auth/session";
import { runUseCase } from "@/lib/use-cases/run";
import { can } from "@/lib/domain/permissions";
import { readLibrary, readLibraryVersion } from "@/lib/use-cases/library-reads";
import { LibraryVersionPage } from "../../../_components/version-page";
import { orNotFound } from "../../../../_components/or-not-found";

export const metadata: Metadata = { title: "Library version" };

export default async function LibraryVersionRoute({ params }: PageProps<"/libraries/[slug]/versions/[number]">) {
  const { slug, number: raw } = await params;
  const number = Number(raw);
  if (!Number.isInteger(number) || number < 1) notFound();
  const actor = await requirePageActor("libraries.read", { next: `/libraries/${encodeURIComponent(slug)}/versions/${number}` });
  const [library, version] = await orNotFound(() =>
    Promise.all([
      runUseCase(readLibrary, { actor, input: { slug } }),
      runUseCase(readLibraryVersion, { actor, input: { slug, number } }),
    ]),
  );
  const maintain = can(actor.role, "libraries.write-draft")
    ? { drafts: library.drafts, withdraw: can(actor.role, "libraries.withdraw"), readsReports: can(actor.role, "runs.read") }
    : null;
  return <LibraryVersionPage version={version} history={library.versions} maintain={maintain} />;
}
