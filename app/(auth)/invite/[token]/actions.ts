"use server";
// Accepting an invitation is public (the link is the credential): the data function checks the
// token, creates the account and signs the new person in; then they go to their home page.
import { headers } from "next/headers";
import { redirect } from "next/navigation";
import { guardedAction } from "@/lib/auth/guard";
import { acceptInvitation } from "@/lib/data/invitations";
import { acceptInvitationSchema } from "@/lib/data/invitation-schemas";

export const acceptInvitationAction = guardedAction(
  { schema: acceptInvitationSchema, permission: "public" },
  async ({ token, password }) => {
    await acceptInvitation({ token, password, signIn: { headers: await headers() } });
    redirect("/home");
  },
);
