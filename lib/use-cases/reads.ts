import "server-only";
// What pages read: each read is a use case like any change, so its permission is checked in one place;
// reads write no audit event. A page still calls requirePageActor first, for the sign-in redirect and
// the 403 page; this is the check that holds if a page forgets.
import { z } from "zod";
import { can } from "@/lib/domain/permissions";
import { listAuditEventsSchema } from "@/lib/domain/schemas/audit";
import { listAuditEvents, type AuditEventDto } from "@/lib/data/audit";
import { getFirmName } from "@/lib/data/firm";
import { countPendingInvitations } from "@/lib/data/invitations";
import { isMailboxEnabled, listCapturedMail } from "@/lib/data/mailbox";
import { countProjects, listProjects, type ProjectDto } from "@/lib/data/projects";
import { countUsers } from "@/lib/data/users";
import { defineUseCase } from "./use-case";

const noInput = z.object({}).default({});

/** The firm's name and whether the demo mailbox is on: the shell every signed-in person sees. */
export const readShell = defineUseCase({
  name: "shell.read",
  permission: "signed-in",
  input: noInput,
  run: async () => ({ firmName: await getFirmName(), mailboxEnabled: isMailboxEnabled() }),
  audit: null,
});

export type HomeSummary = {
  projects?: { count: number; recent: ProjectDto[] };
  people?: { active: number; deactivated: number; admins: number; pendingInvitations: number };
  audit?: { recent: AuditEventDto[] };
  mailboxEnabled: boolean;
};

/** Each part is present only when the actor's role may read it, so the page cannot show a count to the wrong person. */
export const readHome = defineUseCase({
  name: "home.read",
  permission: "signed-in",
  input: noInput,
  run: async (_input, { actor }): Promise<HomeSummary> => {
    // One after another: the queries share the transaction's one connection.
    const summary: HomeSummary = { mailboxEnabled: isMailboxEnabled() };
    if (can(actor.role, "projects.read")) {
      summary.projects = { count: await countProjects(), recent: await listProjects({ limit: 5 }) };
    }
    if (can(actor.role, "users.read")) {
      summary.people = { ...(await countUsers()), pendingInvitations: await countPendingInvitations() };
    }
    if (can(actor.role, "audit.read")) summary.audit = { recent: (await listAuditEvents({ limit: 5 })).events };
    return summary;
  },
  audit: null,
});

export const readProjects = defineUseCase({
  name: "projects.list",
  permission: "projects.read",
  input: z.object({ limit: z.number().int().positive().optional() }).default({}),
  run: async ({ limit }) => listProjects({ limit }),
  audit: null,
});

export const readAuditTrail = defineUseCase({
  name: "audit.list",
  permission: "audit.read",
  input: listAuditEventsSchema,
  run: async ({ limit, before }) => listAuditEvents({ limit, before }),
  audit: null,
});

export const readDemoMailbox = defineUseCase({
  name: "mailbox.read",
  permission: "mailbox.read",
  input: noInput,
  run: async () => listCapturedMail(),
  audit: null,
});

/** Who am I (GET /api/me): any signed-in role. */
export const readSelf = defineUseCase({
  name: "self.read",
  permission: "signed-in",
  input: z.object({}).passthrough(),
  run: async (_input, { actor }) => ({ id: actor.id, name: actor.name, email: actor.email, role: actor.role }),
  audit: null,
});
