import "server-only";
// What the signed-in home page shows. Each part is present only when the actor's role may read it,
// so the page renders what it gets and cannot show a count to the wrong person.
import type { Actor } from "@/lib/auth/actor";
import { can } from "@/lib/auth/permissions";
import { AppError } from "@/lib/errors";
import { listAuditEvents, type AuditEventDto } from "./audit";
import { countPendingInvitations } from "./invitations";
import { countProjects, listProjects, type ProjectDto } from "./projects";
import { countUsers } from "./users";

export type HomeSummary = {
  projects?: { count: number; recent: ProjectDto[] };
  people?: { active: number; deactivated: number; admins: number; pendingInvitations: number };
  audit?: { recent: AuditEventDto[] };
};

export async function getHomeSummary({ actor }: { actor: Actor | null }): Promise<HomeSummary> {
  if (!actor) throw new AppError("unauthenticated");
  const summary: HomeSummary = {};
  const [projectCount, recentProjects, people, pendingInvitations, audit] = await Promise.all([
    can(actor.role, "projects.read") ? countProjects({ actor }) : null,
    can(actor.role, "projects.read") ? listProjects({ actor, limit: 5 }) : null,
    can(actor.role, "users.read") ? countUsers({ actor }) : null,
    can(actor.role, "users.read") ? countPendingInvitations({ actor }) : null,
    can(actor.role, "audit.read") ? listAuditEvents({ actor, limit: 5 }) : null,
  ]);
  if (projectCount !== null && recentProjects) summary.projects = { count: projectCount, recent: recentProjects };
  if (people && pendingInvitations !== null) summary.people = { ...people, pendingInvitations };
  if (audit) summary.audit = { recent: audit.events };
  return summary;
}
