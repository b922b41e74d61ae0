import type { AuditEventDto } from "@/lib/data/audit";
import type { JobDto } from "@/lib/data/jobs";
import { AuditSentence } from "@/components/audit-sentence";
import { LocalTime } from "@/components/local-time";

export function RecentJobs({ jobs }: { jobs: JobDto[] }) {
  if (jobs.length === 0) return <p>No jobs yet.</p>;
  return (
    <ul className="space-y-1.5" data-testid="home-recent-jobs">
      {jobs.map((job) => (
        <li key={job.id} className="flex gap-3">
          <span className="font-mono text-xs leading-5 font-medium whitespace-nowrap text-plate-800 tabular">
            {job.jobNumber}
          </span>
          <span className="text-ink-700">{job.name}</span>
        </li>
      ))}
    </ul>
  );
}

export function RecentAuditEvents({ events, timeZone }: { events: AuditEventDto[]; timeZone?: string }) {
  if (events.length === 0) return <p>No changes recorded yet.</p>;
  return (
    <ul className="space-y-2.5" data-testid="home-recent-audit">
      {events.map((event) => (
        <li key={event.id} data-testid="home-audit-event" data-action={event.action}>
          <span className="block text-ink-700">
            <AuditSentence event={event} />
          </span>
          <LocalTime iso={event.occurredAt} timeZone={timeZone} className="text-xs leading-5 text-ink-500 tabular" />
        </li>
      ))}
    </ul>
  );
}
