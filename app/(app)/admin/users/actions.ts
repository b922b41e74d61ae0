"use server";
// People management. Each action is a use case (lib/use-cases/people.ts) served to a form; the page is
// refreshed once the change has committed.
import { revalidatePath } from "next/cache";
import { serverAction } from "@/lib/use-cases/next";
import { deactivateUser, inviteUser, reactivateUser, revokeInvitation, setUserRole } from "@/lib/use-cases/people";

const refresh = { then: () => revalidatePath("/admin/users") };

export const inviteUserAction = serverAction(inviteUser, refresh);

export const setUserRoleAction = serverAction(setUserRole, refresh);

export const deactivateUserAction = serverAction(deactivateUser, refresh);

export const reactivateUserAction = serverAction(reactivateUser, refresh);

export const revokeInvitationAction = serverAction(revokeInvitation, refresh);
