import type { Metadata } from "next";
import { notFound } from "next/navigation";
import { requirePageActor } from "@/lib/auth/session";
import { VersionView } from "../../../_components/version-view";
import { loadVersionPage } from "../../../_components/version-page";

export const metadata: Metadata = { title: "Standard version" };

export default async function VersionPage({ params }: PageProps<"/standards/[slug]/versions/[number]">) {
  const { slug, number } = await params;
  const actor = await requirePageActor("library.read", {
    next: `/standards/${encodeURIComponent(slug)}/versions/${encodeURIComponent(number)}`,
  });
  if (!/^[1-9][0-9]{0,5}$/.test(number)) notFound();
  const { standard, version, timeZone, withdrawal } = await loadVersionPage(actor, slug, Number(number));
  if (!version) notFound();
  return <VersionView version={version} history={standard.versions} actor={actor} timeZone={timeZone} withdrawal={withdrawal} />;
}
