import type { Metadata } from "next";
import Link from "next/link";
import { notFound } from "next/navigation";
import { requirePageActor } from "@/lib/auth/session";
import { runUseCase } from "@/lib/use-cases/run";
import { readVersionRuns } from "@/lib/use-cases/trace";
import { readProfile } from "@/lib/use-cases/profile";
import { PageHeader } from "@/components/ui/page-header";
import { buttonClasses } from "@/components/ui/button";
import { orNotFound } from "../../../../../_components/or-not-found";
import { RunTable } from "../../../../../runs/_components/run-table";

export const metadata: Metadata = { title: "Runs of a version" };

/**
 * Every run of one published version, newest first, 50 a page: "Older runs" carries the last row shown as the
 * cursor (keyset pagination, so a page stays quick however many runs the version has).
 */
export default async function VersionRunsPage({ params, searchParams }: PageProps<"/standards/[slug]/versions/[number]/runs">) {
  const { slug, number } = await params;
  const path = `/standards/${encodeURIComponent(slug)}/versions/${encodeURIComponent(number)}/runs`;
  const actor = await requirePageActor("runs.read", { next: path });
  if (!/^[1-9][0-9]{0,5}$/.test(number)) notFound();
  const query = await searchParams;
  const cursor = typeof query.cursor === "string" && query.cursor ? query.cursor : undefined;
  const page = await orNotFound(() => runUseCase(readVersionRuns, { actor, input: { slug, number, cursor } }));
  const timeZone = (await runUseCase(readProfile, { actor, input: {} })).timeZone ?? undefined;
  const { version } = page;

  return (
    <>
      <PageHeader
        title={`Runs of ${version.title} v${version.number}`}
        lead={
          <>
            Every run of this version, newest first, in every job.{" "}
            <Link
              href={`/standards/${version.slug}/versions/${version.number}`}
              className="text-plate-700 underline underline-offset-2"
            >
              Open v{version.number}
            </Link>{" "}
            <span className="font-mono text-xs text-ink-500">sha256:{version.contentHash.slice(0, 12)}</span>
          </>
        }
      />
      {page.runs.length === 0 ? (
        <p className="rounded-plate bg-paper-raised px-4 py-6 text-ink-700 ring-1 ring-ink-200" data-testid="version-runs-none">
          {cursor ? "No older runs of this version." : "This version has not been run yet."}
        </p>
      ) : (
        <RunTable runs={page.runs} timeZone={timeZone} />
      )}
      <nav className="mt-4 flex gap-3" aria-label="Pages of runs">
        {cursor ? (
          <Link href={path} className={buttonClasses("secondary")} data-testid="version-runs-newest">
            Newest runs
          </Link>
        ) : null}
        {page.nextCursor ? (
          <Link
            href={`${path}?cursor=${encodeURIComponent(page.nextCursor)}`}
            className={buttonClasses("secondary")}
            data-testid="version-runs-next"
          >
            Older runs
          </Link>
        ) : null}
      </nav>
    </>
  );
}
