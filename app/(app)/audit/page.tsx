import type { Metadata } from "next";
import Link from "next/link";
import { requirePageActor } from "@/lib/auth/session";
import { listAuditEvents } from "@/lib/data/audit";
import { PageHeader } from "@/components/ui/page-header";
import { EmptyState } from "@/components/ui/empty-state";
import { formatDateTime } from "@/components/format-date";

export const metadata: Metadata = { title: "Audit trail" };

const PAGE_SIZE = 50;

export default async function AuditPage({ searchParams }: PageProps<"/audit">) {
  const actor = await requirePageActor("audit.read");
  const { before: beforeParam } = await searchParams;
  const before = typeof beforeParam === "string" && /^\d+$/.test(beforeParam) ? Number(beforeParam) : undefined;
  const { events, nextBefore } = await listAuditEvents({ actor, limit: PAGE_SIZE, before });

  return (
    <>
      <PageHeader
        title="Audit trail"
        lead="Who did what, and when: sign-ins, invitations, role changes and deactivations. Entries are append-only — the database refuses to change or delete them."
      />
      {events.length === 0 ? (
        <EmptyState title={before ? "No earlier events" : "No events yet"}>
          Events appear here as people sign in and admins manage accounts.
        </EmptyState>
      ) : (
        <div className="overflow-x-auto rounded-plate bg-paper-raised shadow-sheet ring-1 ring-ink-200">
          <table className="w-full text-left text-sm" data-testid="audit-table">
            <thead className="border-b border-ink-200 bg-paper-sunk/60 text-xs font-semibold tracking-wide text-ink-500 uppercase">
              <tr>
                <th scope="col" className="px-4 py-2.5">When</th>
                <th scope="col" className="px-4 py-2.5">Who</th>
                <th scope="col" className="px-4 py-2.5">What</th>
                <th scope="col" className="px-4 py-2.5">Subject</th>
              </tr>
            </thead>
            <tbody className="divide-y divide-ink-100">
              {events.map((event) => (
                <tr key={event.id} data-testid="audit-row" data-action={event.action}>
                  <td className="px-4 py-2.5 whitespace-nowrap text-ink-500 tabular">{formatDateTime(event.occurredAt)}</td>
                  <td className="px-4 py-2.5">
                    <span className="text-ink-900">{event.actorName ?? event.actorEmail ?? "Unknown"}</span>
                    {event.actorName && event.actorEmail ? (
                      <span className="block text-xs text-ink-400">{event.actorEmail}</span>
                    ) : null}
                  </td>
                  <td className="px-4 py-2.5 text-ink-900">{event.label}</td>
                  <td className="px-4 py-2.5 font-mono text-xs text-ink-500">{event.subject ?? "—"}</td>
                </tr>
              ))}
            </tbody>
          </table>
        </div>
      )}
      <div className="mt-4 flex gap-4 text-sm">
        {before ? (
          <Link href="/audit" className="text-plate-700 hover:underline">
            Newest events
          </Link>
        ) : null}
        {nextBefore ? (
          <Link href={`/audit?before=${nextBefore}`} className="text-plate-700 hover:underline" data-testid="audit-older">
            Older events
          </Link>
        ) : null}
      </div>
      <section className="mt-10">
        <EmptyState
          title="Integrity checks and traces are coming"
          testId="audit-coming"
          items={[
            "Trace any number on a calc sheet back to its run, template version and engine version.",
            "Reproduce a run from its record and compare the results.",
            "Verify the hash chain of runs, so that an altered record is detected.",
          ]}
        />
      </section>
    </>
  );
}
