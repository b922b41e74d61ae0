import type { Metadata } from "next";
import Link from "next/link";
import { requirePageActor } from "@/lib/auth/session";
import { runUseCase } from "@/lib/use-cases/run";
import { readAuditTrail } from "@/lib/use-cases/reads";
import { listAuditEventsSchema } from "@/lib/domain/schemas/audit";
import { PageHeader } from "@/components/ui/page-header";
import { TableFrame } from "@/components/ui/table";
import { EmptyState } from "@/components/ui/empty-state";
import { formatDateTime } from "@/components/format-date";

export const metadata: Metadata = { title: "Audit trail" };

const PAGE_SIZE = 50;

export default async function AuditPage({ searchParams }: PageProps<"/audit">) {
  const actor = await requirePageActor("audit.read", { next: "/audit" });
  // A hand-edited address with a bad page marker shows the newest events rather than an error.
  const parsed = listAuditEventsSchema.safeParse({ limit: PAGE_SIZE, ...(await searchParams) });
  const { limit, before } = parsed.success ? parsed.data : { limit: PAGE_SIZE, before: undefined };
  const { events, nextBefore } = await runUseCase(readAuditTrail, { actor, input: { limit, before } });

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
        <TableFrame testId="audit-table" headings={["When", "Who", "What", "Subject"]}>
          {events.map((event) => (
            <tr key={event.id} data-testid="audit-row" data-action={event.action}>
              <td className="px-4 py-2.5 whitespace-nowrap text-ink-500 tabular">{formatDateTime(event.occurredAt)}</td>
              <td className="px-4 py-2.5">
                <span className="text-ink-900">{event.actorName ?? event.actorEmail ?? "—"}</span>
                {event.actorName && event.actorEmail ? (
                  <span className="block text-xs text-ink-400">{event.actorEmail}</span>
                ) : null}
              </td>
              <td className="px-4 py-2.5 text-ink-900">{event.label}</td>
              <td className="px-4 py-2.5 font-mono text-xs text-ink-500">{event.subject ?? "—"}</td>
            </tr>
          ))}
        </TableFrame>
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
