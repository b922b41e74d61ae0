// Inviting an address that already has an open invitation: the earlier link is cancelled, and both the
// admin's answer (the invite form's success message reads it) and the audit event say so.
import { eq } from "drizzle-orm";
import { beforeAll, expect, it, vi } from "vitest";
import { db } from "@/db";
import * as schema from "@/db/schema";
import { inviteUserAction } from "@/app/(app)/admin/users/actions";
import { EARLIER_INVITATION_CANCELLED_MESSAGE, INVITATION_MESSAGES } from "@/lib/domain/schemas/invitations";
import { lookupInvitation } from "@/lib/use-cases/invitations";
import { runUseCase } from "@/lib/use-cases/run";
import { firstLink, waitForMessage } from "../support/mailbox";
import { auditEventsFor, createTestUser, signInHeaders, uniqueEmail } from "./helpers/people";

const request = vi.hoisted(() => ({ headers: new Headers() }));
vi.mock("next/headers", () => ({
  headers: async () => request.headers,
  cookies: async () => ({ get: () => undefined, getAll: () => [], set: () => undefined }),
}));
vi.mock("next/cache", () => ({ revalidatePath: () => undefined, revalidateTag: () => undefined }));

beforeAll(async () => {
  const { actor, password } = await createTestUser({ role: "admin" });
  request.headers = await signInHeaders(actor.email, password);
});

type Invited = { ok: true; data: { id: string; email: string; replacedInvitations: string[] } };

it("says that the earlier link was cancelled, in the answer and in the audit event", async () => {
  const email = uniqueEmail("twice");
  const first = (await inviteUserAction(null, { email, name: "Rhea Twice", role: "engineer" })) as Invited;
  expect(first).toMatchObject({ ok: true, data: { email, replacedInvitations: [] } });
  const firstMail = await waitForMessage({ to: email, subjectIncludes: "invited" });
  const firstToken = firstLink(firstMail).split("/invite/")[1];

  const second = (await inviteUserAction(null, { email, name: "Rhea Twice", role: "lead" })) as Invited;
  expect(second).toMatchObject({ ok: true, data: { email, replacedInvitations: [first.data.id] } });

  const [event] = await auditEventsFor({ action: "users.invite", subject: `invitation:${second.data.id}` });
  expect(event.details).toEqual({ email, role: "lead", replacedInvitations: [first.data.id] });
  const [earlier] = await db.select().from(schema.invitations).where(eq(schema.invitations.id, first.data.id));
  expect(earlier.revokedAt).toBeInstanceOf(Date);

  // The earlier e-mail's link now says it was cancelled and points to the newer one.
  expect(await runUseCase(lookupInvitation, { actor: null, input: { token: firstToken } })).toMatchObject({ status: "revoked" });
  expect(INVITATION_MESSAGES.revoked).toMatch(/cancelled.*latest e-mail/);
  expect(EARLIER_INVITATION_CANCELLED_MESSAGE).toMatch(/earlier invitation to this address was cancelled/);
});
