import "server-only";
// What pages read: each read is a use case like any change, so its permission is checked in one place;
// reads write no audit event. A page still calls requirePageActor first, for the sign-in redirect and
// the 403 page; this is the check that holds if a page forgets.
import { z } from "zod";
import { can } from "@/lib/domain/permissions";
import { SIGN_IN_ACTIONS } from "@/lib/domain/audit-actions";
import { auditTrailQuerySchema } from "@/lib/domain/schemas/audit";
import { nextDay, startOfDayInTimeZone } from "@/lib/domain/zoned-time";
import { listAuditEvents, listAuditPeople, type AuditEventDto } from "@/lib/data/audit";
import { getFirmName } from "@/lib/data/firm";
import { countPendingInvitations } from "@/lib/data/invitations";
import { isMailboxEnabled, listCapturedMail } from "@/lib/data/mailbox";
import { countJobs, listJobs, type JobDto } from "@/lib/data/jobs";
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
  jobs?: { count: number; recent: JobDto[] };
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
    if (can(actor.role, "jobs.read")) {
      summary.jobs = { count: await countJobs(), recent: await listJobs({ limit: 5 }) };
    }
    if (can(actor.role, "users.read")) {
      summary.people = { ...(await countUsers()), pendingInvitations: await countPendingInvitations() };
    }
    // The card is for changes: sign-ins would crowd them out within minutes.
    if (can(actor.role, "audit.read"))
      summary.audit = { recent: (await listAuditEvents({ limit: 5, excludeActions: SIGN_IN_ACTIONS })).events };
    return summary;
  },
  audit: null,
});

/** A page of the trail, filtered; dates are whole days in the query's time zone. */
export const readAuditTrail = defineUseCase({
  name: "audit.list",
  permission: "audit.read",
  input: auditTrailQuerySchema,
  run: async ({ limit, before, actor, action, from, to, signIns, tz }) =>
    listAuditEvents({
      limit,
      before,
      actorId: actor,
      action,
      from: from ? startOfDayInTimeZone(from, tz) : undefined,
      until: to ? startOfDayInTimeZone(nextDay(to), tz) : undefined,
      // Asking for a sign-in action by name is asking for sign-ins.
      excludeActions: signIns || action ? [] : SIGN_IN_ACTIONS,
    }),
  audit: null,
});

/** The people the trail can be filtered by. */
export const readAuditPeople = defineUseCase({
  name: "audit.people",
  permission: "audit.read",
  input: noInput,
  run: async () => listAuditPeople(),
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
  // The actor was read from the database (the session check) just before; the answer needs nothing else, so no
  // transaction is opened for it (a BEGIN and a COMMIT saved on the shell's session watcher and the API's who-am-I).
  database: false,
});
