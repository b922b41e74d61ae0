import type { Metadata } from "next";
import Link from "next/link";
import { requirePageActor } from "@/lib/auth/session";
import { can } from "@/lib/domain/permissions";
import { runUseCase } from "@/lib/use-cases/run";
import { listStandards, type StandardListItem } from "@/lib/use-cases/standards";
import { PageHeader } from "@/components/ui/page-header";
import { EmptyState } from "@/components/ui/empty-state";
import { TableFrame } from "@/components/ui/table";
import { buttonClasses } from "@/components/ui/button";
import { formatDate } from "@/components/format-date";
import { VersionStatusBadge } from "../_components/version-status";
import { DraftList } from "../_components/draft-list";
import { StandardsFilter } from "../_components/standards-filter";

export const metadata: Metadata = { title: "Standards" };

const STATUSES = ["current", "published", "superseded", "withdrawn", "all"] as const;
type StatusFilter = (typeof STATUSES)[number];

function matches(item: StandardListItem, q: string, category: string, status: StatusFilter): boolean {
  const v = item.current;
  if (category && v.category !== category) return false;
  if (status === "current" && v.status === "withdrawn") return false;
  if (status !== "current" && status !== "all" && v.status !== status) return false;
  if (!q) return true;
  const haystack = [v.title, v.category, v.summary, item.slug, ...v.tags].join(" ").toLowerCase();
  return q
    .toLowerCase()
    .split(/\s+/)
    .every((word) => haystack.includes(word));
}

export default async function StandardsPage({ searchParams }: PageProps<"/standards">) {
  const actor = await requirePageActor("library.read", { next: "/standards" });
  const params = await searchParams;
  const one = (value: string | string[] | undefined) => (Array.isArray(value) ? value[0] : value)?.slice(0, 100) ?? "";
  const q = one(params.q).trim();
  const category = one(params.category);
  const status = (STATUSES as readonly string[]).includes(one(params.status)) ? (one(params.status) as StatusFilter) : "current";
  const { standards, drafts } = await runUseCase(listStandards, { actor, input: {} });
  const shown = standards.filter((item) => matches(item, q, category, status));
  const categories = [...new Set(standards.map((item) => item.current.category))].sort();
  const writes = can(actor.role, "templates.write-draft");

  return (
    <>
      <PageHeader
        title="Standards"
        lead="The firm's standard calculations: each with its inputs, equations, model and checks, published as numbered versions that never change once issued."
        actions={
          writes ? (
            <Link href="/standards/new" className={buttonClasses("primary")} data-testid="new-standard">
              New standard
            </Link>
          ) : null
        }
      />
      {writes ? <DraftList drafts={drafts} actorId={actor.id} /> : null}
      <StandardsFilter q={q} category={category} status={status} categories={categories} statuses={[...STATUSES]} />
      {standards.length === 0 ? (
        <EmptyState title="No standards yet">
          {writes
            ? "Start one with New standard. A second standards lead reviews each draft before it is published."
            : "Standards leads publish standards here; once a version is published you can open it and run it inside a job."}
        </EmptyState>
      ) : shown.length === 0 ? (
        <p className="rounded-plate bg-paper-raised px-4 py-6 text-ink-700 ring-1 ring-ink-200" data-testid="standards-none">
          No standard matches these filters.
        </p>
      ) : (
        <TableFrame
          testId="standards-table"
          label="Standards"
          headings={["Standard", "Category", "Version", "Published", "Tags"]}
        >
          {shown.map(({ slug, current, versions }) => (
            <tr key={slug} data-testid="standard-row" data-slug={slug}>
              <td className="px-4 py-3">
                <Link
                  href={`/standards/${slug}`}
                  className="font-medium text-plate-800 hover:underline"
                  data-testid="standard-link"
                >
                  {current.title}
                </Link>
                <p className="max-w-md text-xs text-ink-500">{current.summary}</p>
              </td>
              <td className="px-4 py-3 text-ink-700">{current.category}</td>
              <td className="px-4 py-3 whitespace-nowrap tabular">
                <span className="mr-2 font-mono">v{current.number}</span>
                <VersionStatusBadge status={current.status} />
                {versions > 1 ? <span className="ml-2 text-xs text-ink-500">of {versions}</span> : null}
              </td>
              <td className="px-4 py-3 whitespace-nowrap text-ink-500 tabular">{formatDate(current.publishedAt)}</td>
              <td className="px-4 py-3 text-xs text-ink-700">{current.tags.join(", ")}</td>
            </tr>
          ))}
        </TableFrame>
      )}
    </>
  );
}
