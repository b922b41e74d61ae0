"use server";
// People management. Thin: the guard checks the session, the permission and the input; the data
// functions do the work and write their own audit events. The page is refreshed after each change.
import { revalidatePath } from "next/cache";
import type { z } from "zod";
import type { Actor } from "@/lib/auth/actor";
import type { Action } from "@/lib/auth/permissions";
import { guardedAction } from "@/lib/auth/guard";
import { deactivateUser, inviteUser, reactivateUser, setUserRole } from "@/lib/data/users";
import { revokeInvitation } from "@/lib/data/invitations";
import { revokeInvitationSchema } from "@/lib/data/invitation-schemas";
import { deactivateUserSchema, inviteUserSchema, reactivateUserSchema, setUserRoleSchema } from "@/lib/data/user-schemas";

const PAGE = "/admin/users";

/** A guarded action that hands its input and the actor to one data function, then refreshes the page. */
function peopleAction<S extends z.ZodType<object>, T>(
  schema: S,
  permission: Action,
  work: (args: z.infer<S> & { actor: Actor | null }) => Promise<T>,
) {
  return guardedAction({ schema, permission }, async (input, { actor }) => {
    const result = await work({ actor, ...input });
    revalidatePath(PAGE);
    return result;
  });
}

export const inviteUserAction = peopleAction(inviteUserSchema, "users.invite", inviteUser);

export const setUserRoleAction = peopleAction(setUserRoleSchema, "users.set-role", setUserRole);

export const deactivateUserAction = peopleAction(deactivateUserSchema, "users.deactivate", deactivateUser);

export const reactivateUserAction = peopleAction(reactivateUserSchema, "users.deactivate", reactivateUser);

export const revokeInvitationAction = peopleAction(revokeInvitationSchema, "users.invite", revokeInvitation);
