import type { AuditEventDto } from "@/lib/data/audit";
import type { ProjectDto } from "@/lib/data/projects";
import { formatDateTime } from "@/components/format-date";

export function RecentProjects({ projects }: { projects: ProjectDto[] }) {
  if (projects.length === 0) return <p>No projects yet.</p>;
  return (
    <ul className="space-y-1.5" data-testid="home-recent-projects">
      {projects.map((project) => (
        <li key={project.id} className="flex gap-3">
          <span className="font-mono text-xs leading-5 font-medium whitespace-nowrap text-plate-800 tabular">
            {project.jobNumber}
          </span>
          <span className="text-ink-700">{project.name}</span>
        </li>
      ))}
    </ul>
  );
}

export function RecentAuditEvents({ events }: { events: AuditEventDto[] }) {
  if (events.length === 0) return <p>Nothing recorded yet.</p>;
  return (
    <ul className="space-y-1.5" data-testid="home-recent-audit">
      {events.map((event) => (
        <li key={event.id} className="flex flex-wrap gap-x-3">
          <span className="text-xs leading-5 text-ink-400 tabular">{formatDateTime(event.occurredAt)}</span>
          <span className="text-ink-700">
            {event.label}
            {event.actorName || event.actorEmail ? (
              <span className="text-ink-400"> · {event.actorName ?? event.actorEmail}</span>
            ) : null}
          </span>
        </li>
      ))}
    </ul>
  );
}
