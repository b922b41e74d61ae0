import type { Metadata } from "next";
import Link from "next/link";
import { notFound } from "next/navigation";
import { requirePageActor } from "@/lib/auth/session";
import { diffStandards } from "@/lib/standards/diff";
import { VersionDiff } from "@/components/standards/version-diff";
import { PageHeader } from "@/components/ui/page-header";
import { loadVersion } from "../../_components/version-page";

export const metadata: Metadata = { title: "Compare versions" };

const versionNumber = (value: string | string[] | undefined) => {
  const text = Array.isArray(value) ? value[0] : value;
  return text && /^[1-9][0-9]{0,5}$/.test(text) ? Number(text) : null;
};

export default async function DiffPage({ params, searchParams }: PageProps<"/standards/[slug]/diff">) {
  const { slug } = await params;
  const query = await searchParams;
  const actor = await requirePageActor("library.read", { next: `/standards/${encodeURIComponent(slug)}/diff` });
  const to = versionNumber(query.to);
  const from = versionNumber(query.from);
  if (to === null || from === null) notFound();
  const [older, newer] = await Promise.all([loadVersion(actor, slug, from), loadVersion(actor, slug, to)]);
  const diff = diffStandards(older.source, newer.source);
  return (
    <>
      <PageHeader
        title={`${newer.title}: v${from} → v${to}`}
        lead={
          <>
            What changed between the two versions, part by part, then line by line.{" "}
            <Link href={`/standards/${slug}/versions/${to}`} className="text-plate-700 underline underline-offset-2">
              Open v{to}
            </Link>
          </>
        }
      />
      <VersionDiff diff={diff} oldLabel={`Version ${from}`} newLabel={`Version ${to}`} testId="version-diff" />
    </>
  );
}
