// For each server action, a valid input made fresh for one call and the proof that a call the matrix
// allows did its work: the answer and the rows it changed. Both access matrices use them (in-process
// and over HTTP); each keeps its own hand-written table of who may call what.
import { expect } from "vitest";
import { eq } from "drizzle-orm";
import { db } from "@/db";
import * as schema from "@/db/schema";
import { WRONG_CURRENT_PASSWORD_MESSAGE } from "@/lib/domain/schemas/profile";
import { auditEventsFor, createTestUser, inviteWithToken, sessionCount, signInHeaders, uniqueEmail } from "./people";
import { runUseCase } from "@/lib/use-cases/run";
import { approveAndPublish, createStandard, readDraft, submitDraft } from "@/lib/use-cases/standards";
import { LIBRARY_ACTION_FIXTURES } from "./library-action-fixtures";

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
    const { slug, versionId } = await publishedStandard();
    return {
      input: { versionId, reason: "Withdrawn by the access matrix." },
      succeeded: async (answer) => {
        expect(answer).toEqual({
          state: { ok: true, data: { versionId, slug, number: 1, reason: "Withdrawn by the access matrix." } },
        });
        const events = await db
          .select()
          .from(schema.standardVersionEvents)
          .where(eq(schema.standardVersionEvents.versionId, versionId));
        expect(events.map((e) => e.kind)).toEqual(["published", "withdrawn"]);
      },
    };
  },
  ...LIBRARY_ACTION_FIXTURES,
};
