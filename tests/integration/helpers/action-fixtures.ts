// For each server action, a valid input made fresh for one call and the proof that a call the matrix
// allows did its work: the answer and the rows it changed. Both access matrices use them (in-process
// and over HTTP); each keeps its own hand-written table of who may call what.
import { expect } from "vitest";
import { desc, eq } from "drizzle-orm";
import { db } from "@/db";
import * as schema from "@/db/schema";
import { WRONG_CURRENT_PASSWORD_MESSAGE } from "@/lib/domain/schemas/profile";
import { auditEventsFor, createTestUser, inviteWithToken, sessionCount, signInHeaders, uniqueEmail } from "./people";
import { runUseCase } from "@/lib/use-cases/run";
import { approveAndPublish, createStandard, readDraft, submitDraft } from "@/lib/use-cases/standards";
import { createJob } from "@/lib/use-cases/jobs";
import { createRun } from "@/lib/use-cases/runs";
import { getStandardBySlug, listVersionsOf } from "@/lib/data/standards";
import { checkRevision, createCalc, prepareRevision } from "@/lib/use-cases/calcs";

let jobCounter = 0;
/** A job number no other test uses. */
export const matrixJobNumber = () => `AM-${Date.now().toString(36).toUpperCase()}-${(jobCounter++).toString(36).toUpperCase()}`;

/** A job made for the call by an engineer of its own, with a lead as its responsible engineer. */
export async function matrixJob() {
  const [{ actor: engineer }, { actor: lead }] = await Promise.all([
    createTestUser({ role: "engineer", label: "matrix-job" }),
    createTestUser({ role: "lead", label: "matrix-responsible" }),
  ]);
  const jobNumber = matrixJobNumber();
  const { jobId } = await runUseCase(createJob, {
    actor: engineer,
    input: { jobNumber, name: "Matrix job", responsibleEngineerId: lead.id },
  });
  return { jobId, jobNumber, engineer, lead };
}

/** The seeded fixed-end beam's newest version: a published standard every test database has. */
export async function seededVersionId(): Promise<string> {
  const standard = await getStandardBySlug("fixed-end-beam");
  if (!standard) throw new Error("the seed's fixed-end-beam standard is missing");
  return (await listVersionsOf(standard.id))[0].id;
}

/** A run stored in a job made for the call. */
export async function matrixRun() {
  const job = await matrixJob();
  const versionId = await seededVersionId();
  const run = await runUseCase(createRun, {
    actor: job.engineer,
    input: { jobId: job.jobId, versionId, inputs: { L: "5 m" }, unitSystem: "si" },
  });
  return { ...job, versionId, run };
}

/** A run and a calc made for the call, the run issued as revision A (checked first when asked). */
async function matrixRevision({ checked }: { checked: boolean }) {
  const { run, engineer, lead, jobId } = await matrixRun();
  const { calcId } = await runUseCase(createCalc, { actor: engineer, input: { jobId, number: "C-001", title: "Matrix calc" } });
  const { revisionId } = await runUseCase(prepareRevision, {
    actor: engineer,
    input: { calcId, runId: run.id, checkerId: lead.id, issueStatus: "for-approval" },
  });
  if (checked) await runUseCase(checkRevision, { actor: lead, input: { revisionId, decision: "approve" } });
  return { revisionId, calcId, run, engineer, lead, jobId };
}

async function revisionEvents(revisionId: string) {
  return db.select().from(schema.calcRevisionEvents).where(eq(schema.calcRevisionEvents.revisionId, revisionId));
}

async function runRows(jobId: string) {
  return db.select().from(schema.runs).where(eq(schema.runs.jobId, jobId));
}
import { LIBRARY_ACTION_FIXTURES } from "./library-action-fixtures";
import { WITHDRAWAL_ACTION_FIXTURES } from "./withdrawal-action-fixtures";

let standardCounter = 0;
const matrixSlug = () => `matrix-${Date.now().toString(36)}-${(standardCounter++).toString(36)}`;

/** A draft by a lead made for the call (so never the caller's own), submitted for review when asked. */
async function otherLeadsDraft({ submit }: { submit: boolean }) {
  const { actor: author } = await createTestUser({ role: "lead", label: "matrix-author" });
  const slug = matrixSlug();
  const { draftId } = await runUseCase(createStandard, { actor: author, input: { slug, title: "Matrix beam" } });
  const reviewId = submit
    ? (await runUseCase(submitDraft, { actor: author, input: { draftId, changelog: "For the matrix." } })).reviewId
    : null;
  return { author, slug, draftId, reviewId };
}

/** A standard published by two leads made for the call. */
async function publishedStandard() {
  const { author, slug, reviewId } = await otherLeadsDraft({ submit: true });
  const { actor: reviewer } = await createTestUser({ role: "lead", label: "matrix-reviewer" });
  const published = await runUseCase(approveAndPublish, { actor: reviewer, input: { reviewId: reviewId! } });
  return { author, slug, versionId: published.versionId };
}

/** Only the author edits a draft: a lead who is not gets past the permission check and is told so. */
const notTheAuthor = (answer: ActionAnswer) =>
  expect(answer).toEqual({
    state: {
      ok: false,
      error: { code: "forbidden", message: "Only the draft's author edits it; start your own draft from the version instead." },
    },
  });

async function draftRow(id: string) {
  const [row] = await db.select().from(schema.standardDrafts).where(eq(schema.standardDrafts.id, id));
  return row;
}

/** What calling a server action came to: its ActionState, or the redirect it answered with. */
export type ActionAnswer =
  | {
      state:
        | { ok: true; data: unknown }
        | { ok: false; error: { code: string; message: string; fieldErrors?: Record<string, string[]> } }
        | null;
    }
  | { redirect: string };

export type ActionFixture = { input: Record<string, unknown>; succeeded: (answer: ActionAnswer) => Promise<void> };

async function userRow(id: string) {
  const [row] = await db.select().from(schema.user).where(eq(schema.user.id, id));
  return row;
}

async function invitationRow(id: string) {
  const [row] = await db.select().from(schema.invitations).where(eq(schema.invitations.id, id));
  return row;
}

/** Keyed "<file>#<export>" exactly as the build's server-reference manifest names the action. */
export const ACTION_FIXTURES: Record<string, () => Promise<ActionFixture>> = {
  "app/(app)/admin/users/actions.ts#inviteUserAction": async () => {
    const email = uniqueEmail("matrix");
    return {
      input: { email, name: "Matrix Person", role: "engineer" },
      succeeded: async (answer) => {
        expect(answer).toEqual({
          state: {
            ok: true,
            data: {
              id: expect.any(String),
              email,
              name: "Matrix Person",
              role: "engineer",
              expiresAt: expect.any(String),
              createdAt: expect.any(String),
              replacedInvitations: [],
            },
          },
        });
        const [row] = await db.select().from(schema.invitations).where(eq(schema.invitations.email, email));
        expect(row).toMatchObject({ name: "Matrix Person", role: "engineer", acceptedAt: null, revokedAt: null });
        expect(await auditEventsFor({ action: "users.invite", subject: `invitation:${row.id}` })).toHaveLength(1);
      },
    };
  },
  "app/(app)/admin/users/actions.ts#setUserRoleAction": async () => {
    const { actor: target } = await createTestUser({ role: "engineer" });
    return {
      input: { userId: target.id, role: "lead" },
      succeeded: async (answer) => {
        expect(answer).toMatchObject({
          state: {
            ok: true,
            data: { user: { id: target.id, email: target.email, role: "lead", status: "active" }, previousRole: "engineer" },
          },
        });
        expect((await userRow(target.id)).role).toBe("lead");
        const [event] = await auditEventsFor({ action: "users.set-role", subject: `user:${target.id}` });
        expect(event.details).toEqual({ email: target.email, from: "engineer", to: "lead" });
      },
    };
  },
  "app/(app)/admin/users/actions.ts#deactivateUserAction": async () => {
    const { actor: target, password } = await createTestUser({ role: "engineer" });
    await signInHeaders(target.email, password);
    return {
      input: { userId: target.id },
      succeeded: async (answer) => {
        // sessionsEnded: the one session opened above.
        expect(answer).toMatchObject({
          state: { ok: true, data: { user: { id: target.id, status: "deactivated" }, sessionsEnded: 1 } },
        });
        expect((await userRow(target.id)).deactivatedAt).toBeInstanceOf(Date);
        expect(await sessionCount(target.id)).toBe(0); // the open session ended with it
        const [event] = await auditEventsFor({ action: "users.deactivate", subject: `user:${target.id}` });
        expect(event.details).toEqual({ email: target.email, sessionsEnded: 1 });
      },
    };
  },
  "app/(app)/admin/users/actions.ts#reactivateUserAction": async () => {
    const { actor: target } = await createTestUser({ role: "engineer", deactivated: true });
    return {
      input: { userId: target.id },
      succeeded: async (answer) => {
        expect(answer).toMatchObject({ state: { ok: true, data: { id: target.id, status: "active", deactivatedAt: null } } });
        expect((await userRow(target.id)).deactivatedAt).toBeNull();
        const [event] = await auditEventsFor({ action: "users.reactivate", subject: `user:${target.id}` });
        expect(event.details).toEqual({ email: target.email });
      },
    };
  },
  "app/(app)/admin/users/actions.ts#revokeInvitationAction": async () => {
    const { invitation } = await inviteWithToken("auditor");
    return {
      input: { invitationId: invitation.id },
      succeeded: async (answer) => {
        expect(answer).toEqual({
          state: {
            ok: true,
            data: {
              id: invitation.id,
              email: invitation.email,
              name: invitation.name,
              role: "auditor",
              expiresAt: invitation.expiresAt,
              createdAt: invitation.createdAt,
            },
          },
        });
        expect((await invitationRow(invitation.id)).revokedAt).toBeInstanceOf(Date);
        const [event] = await auditEventsFor({ action: "invitations.revoke", subject: `invitation:${invitation.id}` });
        expect(event.details).toEqual({ email: invitation.email, role: "auditor" });
      },
    };
  },
  // The caller is always the one whose password would change, and the browser matrix calls as the demo
  // people, whose passwords other tests sign in with. So the call names a wrong current password: getting
  // past the permission check shows as the use case's own answer, a refused current password, audited.
  "app/(app)/profile/actions.ts#changePasswordAction": async () => ({
    input: {
      currentPassword: "not-the-current-password",
      password: "matrix-new-password-1",
      confirmPassword: "matrix-new-password-1",
    },
    succeeded: async (answer) => {
      expect(answer).toEqual({
        state: {
          ok: false,
          error: {
            code: "invalid-input",
            message: WRONG_CURRENT_PASSWORD_MESSAGE,
            fieldErrors: { currentPassword: [WRONG_CURRENT_PASSWORD_MESSAGE] },
          },
        },
      });
      const events = await auditEventsFor({ action: "profile.change-password.failed" });
      const newest = events.sort((a, b) => b.id - a.id)[0];
      expect(newest?.details).toEqual({ reason: "wrong-current-password" });
    },
  }),
  // "" is the browser's own time zone: the demo people keep theirs as it was (none).
  "app/(app)/profile/actions.ts#setTimeZoneAction": async () => ({
    input: { timeZone: "" },
    succeeded: async (answer) => {
      expect(answer).toMatchObject({ state: { ok: true, data: { userId: expect.any(String), timeZone: null } } });
      const { userId } = (answer as { state: { data: { userId: string } } }).state.data;
      expect((await userRow(userId)).timeZone).toBeNull();
    },
  }),
  // US customary, then back to SI by hand, so whoever called (a demo person in the browser matrix) keeps SI.
  "app/(app)/profile/actions.ts#setDisplayUnitsAction": async () => ({
    input: { displayUnits: "us" },
    succeeded: async (answer) => {
      expect(answer).toMatchObject({ state: { ok: true, data: { userId: expect.any(String), displayUnits: "us" } } });
      const { userId } = (answer as { state: { data: { userId: string } } }).state.data;
      expect((await userRow(userId)).displayUnits).toBe("us");
      await db.update(schema.user).set({ displayUnits: "si" }).where(eq(schema.user.id, userId));
    },
  }),
  // The whole log checked: nothing wrong in the test database, and the check itself on the audit trail.
  "app/(app)/audit/integrity/actions.ts#runIntegrityCheckAction": async () => ({
    input: {},
    succeeded: async (answer) => {
      expect(answer).toMatchObject({ state: { ok: true, data: { ok: true, problems: [] } } });
      const { leaves, heads } = (answer as { state: { data: { leaves: number; heads: number } } }).state.data;
      expect(leaves).toBeGreaterThan(0);
      expect(heads).toBeGreaterThan(0);
      const events = await db
        .select()
        .from(schema.auditEvents)
        .where(eq(schema.auditEvents.action, "integrity.check"))
        .orderBy(desc(schema.auditEvents.id))
        .limit(1);
      expect(events[0]?.details).toMatchObject({ ok: true, leaves, heads, problems: 0, first: null });
    },
  }),
  // A real link: the account is made, the person signed in and sent home.
  "app/(auth)/invite/[token]/actions.ts#acceptInvitationAction": async () => {
    const { invitation, token } = await inviteWithToken("lead");
    return {
      input: { token, password: "long-enough-pass", confirmPassword: "long-enough-pass" },
      succeeded: async (answer) => {
        expect(answer).toEqual({ redirect: "/home" });
        const [created] = await db.select().from(schema.user).where(eq(schema.user.email, invitation.email));
        expect(created).toMatchObject({ name: invitation.name, role: "lead", deactivatedAt: null });
        expect((await invitationRow(invitation.id)).acceptedAt).toBeInstanceOf(Date);
        expect(await sessionCount(created.id)).toBe(1);
      },
    };
  },
  "app/(app)/standards/actions.ts#createStandardAction": async () => {
    const slug = matrixSlug();
    return {
      input: { slug, title: "Matrix standard" },
      succeeded: async (answer) => {
        const [standard] = await db.select().from(schema.standards).where(eq(schema.standards.slug, slug));
        const [draft] = await db.select().from(schema.standardDrafts).where(eq(schema.standardDrafts.standardId, standard.id));
        expect(answer).toEqual({ redirect: `/standards/drafts/${draft.id}` });
        expect(draft.state).toBe("editing");
      },
    };
  },
  "app/(app)/standards/actions.ts#startDraftAction": async () => {
    const { versionId } = await publishedStandard();
    return {
      input: { versionId },
      succeeded: async (answer) => {
        const drafts = await db.select().from(schema.standardDrafts).where(eq(schema.standardDrafts.basedOnVersionId, versionId));
        expect(drafts).toHaveLength(1);
        expect(answer).toEqual({ redirect: `/standards/drafts/${drafts[0].id}` });
      },
    };
  },
  "app/(app)/standards/actions.ts#saveDraftAction": async () => {
    const { draftId } = await otherLeadsDraft({ submit: false });
    const before = (await draftRow(draftId)).source;
    return {
      input: { draftId, source: "changed by someone else" },
      succeeded: async (answer) => {
        notTheAuthor(answer);
        expect((await draftRow(draftId)).source).toBe(before);
      },
    };
  },
  "app/(app)/standards/actions.ts#previewSourceAction": async () => {
    const { draftId } = await otherLeadsDraft({ submit: false });
    const before = await draftRow(draftId);
    return {
      input: { draftId, source: "previewed by someone else" },
      succeeded: async (answer) => {
        notTheAuthor(answer);
        expect(await draftRow(draftId)).toEqual(before);
      },
    };
  },
  "app/(app)/standards/actions.ts#submitDraftAction": async () => {
    const { draftId } = await otherLeadsDraft({ submit: false });
    return {
      input: { draftId, changelog: "Not mine to submit." },
      succeeded: async (answer) => {
        notTheAuthor(answer);
        expect((await draftRow(draftId)).state).toBe("editing");
      },
    };
  },
  "app/(app)/standards/actions.ts#discardDraftAction": async () => {
    const { draftId } = await otherLeadsDraft({ submit: false });
    return {
      input: { draftId },
      succeeded: async (answer) => {
        notTheAuthor(answer);
        expect((await draftRow(draftId)).state).toBe("editing");
      },
    };
  },
  "app/(app)/standards/actions.ts#returnDraftAction": async () => {
    const { draftId, reviewId, author } = await otherLeadsDraft({ submit: true });
    return {
      input: { reviewId, note: "", comments: [{ line: 3, body: "Say which sections this covers." }] },
      succeeded: async (answer) => {
        expect(answer).toMatchObject({ state: { ok: true, data: { draftId, round: 1, comments: 1, authorName: author.name } } });
        const view = await runUseCase(readDraft, { actor: author, input: { draftId } });
        expect(view.draft.state).toBe("editing");
        expect(view.reviews[0].comments.map((c) => [c.line, c.body])).toEqual([[3, "Say which sections this covers."]]);
      },
    };
  },
  "app/(app)/standards/actions.ts#approveAndPublishAction": async () => {
    const { slug, reviewId } = await otherLeadsDraft({ submit: true });
    return {
      input: { reviewId },
      succeeded: async (answer) => {
        expect(answer).toEqual({ redirect: `/standards/${slug}/versions/1` });
        const [standard] = await db.select().from(schema.standards).where(eq(schema.standards.slug, slug));
        const versions = await db
          .select()
          .from(schema.standardVersions)
          .where(eq(schema.standardVersions.standardId, standard.id));
        expect(versions.map((v) => v.number)).toEqual([1]);
      },
    };
  },
  "app/(app)/standards/actions.ts#withdrawVersionAction": async () => {
    const { versionId } = await publishedStandard();
    return {
      input: { versionId, reason: "Withdrawn by the access matrix." },
      succeeded: async (answer) => {
        const events = await db
          .select()
          .from(schema.standardVersionEvents)
          .where(eq(schema.standardVersionEvents.versionId, versionId));
        expect(events.map((e) => e.kind)).toEqual(["published", "withdrawn"]);
        // Withdrawn: on to its impact report.
        const [withdrawal] = await db
          .select()
          .from(schema.withdrawals)
          .where(eq(schema.withdrawals.standardVersionId, versionId));
        expect(withdrawal).toMatchObject({ subject: "standard-version", reason: "Withdrawn by the access matrix." });
        expect(answer).toEqual({ redirect: `/withdrawals/${withdrawal.id}` });
      },
    };
  },
  "app/(app)/jobs/actions.ts#createJobAction": async () => {
    const { actor: lead } = await createTestUser({ role: "lead", label: "matrix-responsible" });
    const jobNumber = matrixJobNumber();
    return {
      input: { jobNumber, name: "Matrix depot", client: "Matrix client", site: "", responsibleEngineerId: lead.id },
      succeeded: async (answer) => {
        expect(answer).toEqual({ redirect: `/jobs/${jobNumber}` });
        const [row] = await db.select().from(schema.jobs).where(eq(schema.jobs.jobNumber, jobNumber));
        expect(row).toMatchObject({ name: "Matrix depot", client: "Matrix client", site: null, responsibleEngineerId: lead.id });
        expect(await auditEventsFor({ action: "jobs.create", subject: `job:${row.id}` })).toHaveLength(1);
      },
    };
  },
  "app/(app)/jobs/actions.ts#updateJobAction": async () => {
    const { jobId, jobNumber, lead } = await matrixJob();
    return {
      input: { jobId, jobNumber, name: "Matrix job, renamed", responsibleEngineerId: lead.id, status: "on-hold" },
      succeeded: async (answer) => {
        expect(answer).toEqual({ redirect: `/jobs/${jobNumber}` });
        const [row] = await db.select().from(schema.jobs).where(eq(schema.jobs.id, jobId));
        expect(row).toMatchObject({ name: "Matrix job, renamed", status: "on-hold" });
        const [event] = await auditEventsFor({ action: "jobs.update", subject: `job:${jobId}` });
        expect(event.details).toEqual({
          jobNumber,
          changes: { name: ["Matrix job", "Matrix job, renamed"], status: ["active", "on-hold"] },
        });
      },
    };
  },
  "app/(app)/jobs/actions.ts#createRunAction": async () => {
    const { jobId } = await matrixJob();
    const versionId = await seededVersionId();
    return {
      input: { jobId, versionId, inputs: { L: "7 m", w_L: "12 kN/m" }, unitSystem: "si" },
      succeeded: async (answer) => {
        const [row] = await runRows(jobId);
        expect(answer).toEqual({ redirect: `/runs/${row.id}` });
        expect(row).toMatchObject({ versionId, outcome: "succeeded", pass: true });
        expect(JSON.parse(row.record).typed).toEqual({ L: "7 m", w_L: "12 kN/m" });
      },
    };
  },
  // Sign-off steps belong to one person each (who ran the run, the assigned checker, the job's responsible
  // engineer): a caller whose role may take the step, but who is not that person, is told who is.
  "app/(app)/runs/actions.ts#createCalcAction": async () => {
    const { jobId } = await matrixJob();
    return {
      input: { jobId, number: "C-100", title: "Matrix calc" },
      succeeded: async (answer) => {
        expect(answer).toMatchObject({ state: { ok: true, data: { number: "C-100", title: "Matrix calc" } } });
        const rows = await db.select().from(schema.calcs).where(eq(schema.calcs.jobId, jobId));
        expect(rows.map((r) => [r.number, r.title])).toEqual([["C-100", "Matrix calc"]]);
      },
    };
  },
  "app/(app)/runs/actions.ts#prepareRevisionAction": async () => {
    const { run, engineer, lead, jobId } = await matrixRun();
    const { calcId } = await runUseCase(createCalc, { actor: engineer, input: { jobId, number: "C-002", title: "Matrix calc" } });
    return {
      input: { calcId, runId: run.id, checkerId: lead.id, issueStatus: "preliminary" },
      succeeded: async (answer) => {
        expect(answer).toEqual({
          state: {
            ok: false,
            error: { code: "forbidden", message: `Only ${engineer.name}, who ran it, may issue this run as a revision.` },
          },
        });
        expect(await db.select().from(schema.calcRevisions).where(eq(schema.calcRevisions.calcId, calcId))).toEqual([]);
      },
    };
  },
  "app/(app)/runs/actions.ts#checkRevisionAction": async () => {
    const { revisionId, lead } = await matrixRevision({ checked: false });
    return {
      input: { revisionId, decision: "approve" },
      succeeded: async (answer) => {
        expect(answer).toEqual({
          state: {
            ok: false,
            error: { code: "forbidden", message: `Only the assigned checker, ${lead.name}, checks this revision.` },
          },
        });
        expect((await revisionEvents(revisionId)).map((e) => e.kind)).toEqual(["prepared"]);
      },
    };
  },
  "app/(app)/runs/actions.ts#approveRevisionAction": async () => {
    const { revisionId, lead } = await matrixRevision({ checked: true });
    return {
      input: { revisionId },
      succeeded: async (answer) => {
        expect(answer).toEqual({
          state: {
            ok: false,
            error: { code: "forbidden", message: `Only the job's responsible engineer, ${lead.name}, approves its calcs.` },
          },
        });
        expect((await revisionEvents(revisionId)).map((e) => e.kind)).toEqual(["prepared", "checked"]);
      },
    };
  },
  // A reproduction writes nothing but its audit event; the comparison comes back to the page.
  "app/(app)/runs/actions.ts#reproduceRunAction": async () => {
    const { run } = await matrixRun();
    return {
      input: { id: run.id, mode: "as-issued" },
      succeeded: async (answer) => {
        expect(answer).toMatchObject({
          state: { ok: true, data: { runId: run.id, mode: "as-issued", comparison: { identical: true, differing: 0 } } },
        });
        const events = await auditEventsFor({ action: "runs.reproduce", subject: `run:${run.id}` });
        expect(events.map((e) => e.details)).toEqual([
          {
            runId: run.id,
            mode: "as-issued",
            bundleSha256: expect.stringMatching(/^[0-9a-f]{64}$/),
            identical: true,
            differing: 0,
          },
        ]);
      },
    };
  },
  ...LIBRARY_ACTION_FIXTURES,
  ...WITHDRAWAL_ACTION_FIXTURES,
};
