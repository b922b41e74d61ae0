import type { Metadata } from "next";
import Link from "next/link";
import { requirePageActor } from "@/lib/auth/session";
import { runUseCase } from "@/lib/use-cases/run";
import { readRunForm } from "@/lib/use-cases/run-form";
import { PageHeader } from "@/components/ui/page-header";
import { Caution } from "@/components/standards/caution";
import { orNotFound } from "../../../../_components/or-not-found";
import { RunForm } from "./_components/run-form";

export const metadata: Metadata = { title: "Run a standard" };

export default async function RunStandardPage({ params, searchParams }: PageProps<"/jobs/[jobNumber]/run/[slug]">) {
  const { jobNumber, slug } = await params;
  const number = decodeURIComponent(jobNumber);
  const query = await searchParams;
  const one = (value: string | string[] | undefined) => (Array.isArray(value) ? value[0] : value);
  const here = `/jobs/${encodeURIComponent(number)}/run/${encodeURIComponent(slug)}`;
  const actor = await requirePageActor("runs.create", { next: here });
  const data = await orNotFound(() =>
    runUseCase(readRunForm, {
      actor,
      input: { jobNumber: number, slug, version: one(query.version), from: one(query.from) },
    }),
  );
  const jobHref = `/jobs/${encodeURIComponent(data.job.jobNumber)}`;
  return (
    <>
      <PageHeader
        title={`Run ${data.version.title}`}
        lead={`Version ${data.version.number}, in job ${data.job.jobNumber} · ${data.job.name}. ${data.version.summary}`}
      />
      <p className="mb-4 text-sm text-ink-700">
        <Link href={jobHref} className="text-plate-700 hover:underline">
          Back to {data.job.jobNumber}
        </Link>{" "}
        ·{" "}
        <Link href={`/standards/${data.version.slug}/versions/${data.version.number}`} className="text-plate-700 hover:underline">
          Read version {data.version.number}
        </Link>
        {data.from ? (
          <>
            {" "}
            · filled from run{" "}
            <Link href={`/runs/${data.from.id}`} className="font-mono text-plate-700 hover:underline">
              {data.from.id.slice(0, 8)}
            </Link>
          </>
        ) : null}
      </p>
      {data.version.status === "superseded" || data.newer ? (
        <p className="mb-4 rounded-plate bg-warn-100 p-3 text-sm text-warn-700" data-testid="run-superseded">
          Version {data.version.number} is superseded{data.newer ? ` by version ${data.newer.number}` : ""}. Approving a calc on
          it will need a recorded reason.
        </p>
      ) : null}
      {data.job.status === "closed" ? (
        <p className="mb-4 rounded-plate bg-ink-100 p-3 text-sm text-ink-700">This job is closed: Run will be refused.</p>
      ) : null}
      <Caution />
      <RunForm data={data} />
    </>
  );
}
