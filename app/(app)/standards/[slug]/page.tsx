import type { Metadata } from "next";
import Link from "next/link";
import { requirePageActor } from "@/lib/auth/session";
import { PageHeader } from "@/components/ui/page-header";
import { VersionView } from "../_components/version-view";
import { loadVersionPage } from "../_components/version-page";

export const metadata: Metadata = { title: "Standard" };

export default async function StandardPage({ params }: PageProps<"/standards/[slug]">) {
  const { slug } = await params;
  const actor = await requirePageActor("library.read", { next: `/standards/${encodeURIComponent(slug)}` });
  const { standard, version, timeZone, withdrawal } = await loadVersionPage(actor, slug);
  if (!version)
    return (
      <>
        <PageHeader title={slug} lead="No version of this standard is published yet." />
        <ul className="space-y-2">
          {standard.drafts.map((draft) => (
            <li key={draft.id}>
              <Link href={`/standards/drafts/${draft.id}`} className="text-plate-700 hover:underline">
                Draft by {draft.authorName} ({draft.state === "in-review" ? "in review" : "being edited"})
              </Link>
            </li>
          ))}
        </ul>
      </>
    );
  return <VersionView version={version} history={standard.versions} actor={actor} timeZone={timeZone} withdrawal={withdrawal} />;
}
