import type { Metadata } from "next";
import Link from "next/link";
import { requirePageActor } from "@/lib/auth/session";
import { runUseCase } from "@/lib/use-cases/run";
import { readProfile } from "@/lib/use-cases/profile";
import { readAuditPeople, readAuditTrail } from "@/lib/use-cases/reads";
import { auditTrailHref, auditTrailQuerySchema, type AuditTrailQuery } from "@/lib/domain/schemas/audit";
import { auditActorOf, auditSubjectOf, type AuditPerson } from "@/lib/domain/audit-sentence";
import type { AuditEventDto } from "@/lib/data/audit";
import { PageHeader } from "@/components/ui/page-header";
import { TableFrame } from "@/components/ui/table";
import { EmptyState } from "@/components/ui/empty-state";
import { Notice } from "@/components/ui/notice";
import { AuditSentence } from "@/components/audit-sentence";
import { LocalTime } from "@/components/local-time";
import { RunLogLink } from "../runs/_components/run-log-link";
import { AuditFilters, type AuditFilterErrors, type AuditFilterValues } from "../_components/audit-filters";

export const metadata: Metadata = { title: "Audit trail" };

/** How the message names a filter the address got wrong. */
const FILTER_NAMES: Record<keyof AuditFilterErrors, string> = {
  actor: "Who",
  action: "What",
  from: "From",
  to: "To",
  signIns: "Show sign-ins",
  tz: "Time zone",
  limit: "Events a page",
  before: "Page",
};

/** One value of a search param as the form shows it back (a repeated param shows its first). */
function shown(value: string | string[] | undefined): string {
  return Array.isArray(value) ? (value[0] ?? "") : (value ?? "");
}

export default async function AuditPage({ searchParams }: PageProps<"/audit">) {
  const actor = await requirePageActor("audit.read", { next: "/audit" });
  const raw = await searchParams;
  // The address is checked here, so that a bad filter is a message on the page rather than an error page.
  const parsed = auditTrailQuerySchema.safeParse(raw);
  const errors: AuditFilterErrors = {};
  if (!parsed.success) {
    for (const issue of parsed.error.issues) {
      const field = String(issue.path[0] ?? "before") as keyof AuditFilterErrors;
      errors[field] ??= issue.message;
    }
  }
  const values: AuditFilterValues = parsed.success
    ? {
        actor: parsed.data.actor ?? "",
        action: parsed.data.action ?? "",
        from: parsed.data.from ?? "",
        to: parsed.data.to ?? "",
        signIns: parsed.data.signIns,
      }
    : {
        actor: shown(raw.actor),
        action: shown(raw.action),
        from: shown(raw.from),
        to: shown(raw.to),
        signIns: ["1", "on"].includes(shown(raw.signIns)),
      };
  // One after another: each use case is its own transaction on the one pool.
  const people = await runUseCase(readAuditPeople, { actor, input: {} });
  // The person's own time zone from their profile, when set; otherwise the browser's.
  const timeZone = (await runUseCase(readProfile, { actor, input: {} })).timeZone ?? undefined;
  const trail = parsed.success ? await runUseCase(readAuditTrail, { actor, input: parsed.data }) : null;

  return (
    <>
      <PageHeader
        title="Audit trail"
        lead="Who did what, to whom, and when: invitations, role changes, deactivations and sign-ins. Entries are append-only — the database refuses to change or delete them."
        actions={<RunLogLink actor={actor} testId="audit-run-log-link" />}
      />
      <AuditFilters values={values} errors={errors} people={people} timeZone={timeZone} />
      {trail && parsed.success ? (
        <AuditResults query={parsed.data} events={trail.events} nextBefore={trail.nextBefore} timeZone={timeZone} />
      ) : (
        <Notice tone="fault" title="These filters cannot be used" testId="audit-filter-error">
          <ul className="list-disc pl-5">
            {Object.entries(errors).map(([field, message]) => (
              <li key={field}>
                {FILTER_NAMES[field as keyof AuditFilterErrors]} “{shown(raw[field])}”: {message}
              </li>
            ))}
          </ul>
          <p className="mt-1">Correct them above, or clear the filters to see the whole trail.</p>
        </Notice>
      )}
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

function AuditResults({
  query,
  events,
  nextBefore,
  timeZone,
}: {
  query: AuditTrailQuery;
  events: AuditEventDto[];
  nextBefore: number | null;
  timeZone?: string;
}) {
  const filtered = Boolean(query.actor || query.action || query.from || query.to);
  const signInsHidden = !query.signIns && !query.action;
  return (
    <>
      {signInsHidden ? (
        <p className="mb-3 text-sm text-ink-500" data-testid="audit-sign-ins-hidden">
          Sign-ins and failed sign-ins are hidden; tick “Show sign-ins” to list them too.
        </p>
      ) : null}
      {events.length === 0 ? (
        <EmptyState title={query.before ? "No earlier events" : filtered ? "No events match these filters" : "No events yet"}>
          {filtered
            ? "Widen the dates or choose another person or action."
            : "Events appear here as people sign in and admins manage accounts."}
        </EmptyState>
      ) : (
        <TableFrame testId="audit-table" headings={["When", "What happened", "Who", "Subject", "IP address"]}>
          {events.map((event) => (
            <tr key={event.id} data-testid="audit-row" data-action={event.action}>
              <td className="px-4 py-2.5 align-top text-ink-500 tabular">
                <LocalTime iso={event.occurredAt} timeZone={timeZone} />
              </td>
              <td className="min-w-48 px-4 py-2.5 align-top text-ink-700 sm:min-w-64">
                <AuditSentence event={event} />
              </td>
              <td className="px-4 py-2.5 align-top" data-testid="audit-actor">
                <PersonCell who={auditActorOf(event)} />
              </td>
              <td className="px-4 py-2.5 align-top" data-testid="audit-subject">
                {event.subject === null && typeof event.details.email !== "string" ? (
                  <span className="text-ink-500">—</span>
                ) : (
                  <PersonCell
                    who={auditSubjectOf(event)}
                    note={event.subject?.startsWith("invitation:") ? "Invitation" : undefined}
                  />
                )}
              </td>
              <td className="px-4 py-2.5 align-top font-mono text-xs whitespace-nowrap text-ink-500">{event.ipAddress ?? "—"}</td>
            </tr>
          ))}
        </TableFrame>
      )}
      <nav aria-label="Pages of the audit trail" className="mt-4 flex gap-4 text-sm">
        {query.before ? (
          <Link href={auditTrailHref(query)} className="text-plate-700 hover:underline" data-testid="audit-newest">
            Newest events
          </Link>
        ) : null}
        {nextBefore ? (
          <Link
            href={auditTrailHref(query, { before: nextBefore })}
            className="text-plate-700 hover:underline"
            data-testid="audit-older"
          >
            Older events
          </Link>
        ) : null}
      </nav>
    </>
  );
}

/** A name with its e-mail beneath, or the plain words for someone not on record. */
function PersonCell({ who, note }: { who: AuditPerson | string; note?: string }) {
  if (typeof who === "string") return <span className="text-ink-500 italic">{who.charAt(0).toUpperCase() + who.slice(1)}</span>;
  return (
    <>
      {note ? <span className="block text-xs text-ink-500">{note}</span> : null}
      <span className="text-ink-900 [overflow-wrap:anywhere]">{who.person}</span>
      {who.email ? <span className="block text-xs whitespace-nowrap text-ink-500">{who.email}</span> : null}
    </>
  );
}
