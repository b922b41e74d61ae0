"use server";
// People management. Thin: the guard checks the session, the permission and the input; the data
// functions do the work and write their own audit events. The page is refreshed after each change.
import { revalidatePath } from "next/cache";
import { guardedAction } from "@/lib/auth/guard";
import { deactivateUser, inviteUser, reactivateUser, setUserRole } from "@/lib/data/users";
import { revokeInvitation } from "@/lib/data/invitations";
import { revokeInvitationSchema } from "@/lib/data/invitation-schemas";
import { deactivateUserSchema, inviteUserSchema, reactivateUserSchema, setUserRoleSchema } from "@/lib/data/user-schemas";

const PAGE = "/admin/users";

export const inviteUserAction = guardedAction({ schema: inviteUserSchema, permission: "users.invite" }, async (input, { actor }) => {
  const invitation = await inviteUser({ actor, ...input });
  revalidatePath(PAGE);
  return invitation;
});

export const setUserRoleAction = guardedAction({ schema: setUserRoleSchema, permission: "users.set-role" }, async (input, { actor }) => {
  const updated = await setUserRole({ actor, ...input });
  revalidatePath(PAGE);
  return updated;
});

export const deactivateUserAction = guardedAction(
  { schema: deactivateUserSchema, permission: "users.deactivate" },
  async (input, { actor }) => {
    const updated = await deactivateUser({ actor, ...input });
    revalidatePath(PAGE);
    return updated;
  },
);

export const reactivateUserAction = guardedAction(
  { schema: reactivateUserSchema, permission: "users.deactivate" },
  async (input, { actor }) => {
    const updated = await reactivateUser({ actor, ...input });
    revalidatePath(PAGE);
    return updated;
  },
);

export const revokeInvitationAction = guardedAction(
  { schema: revokeInvitationSchema, permission: "users.invite" },
  async (input, { actor }) => {
    const revoked = await revokeInvitation({ actor, ...input });
    revalidatePath(PAGE);
    return revoked;
  },
);
