"use server";
// Accepting an invitation is public (the link is the credential): the use case checks the token and
// creates the account; once that has committed, the new person is signed in and goes to their home page.
import { headers } from "next/headers";
import { redirect } from "next/navigation";
import { auth } from "@/lib/auth/server";
import { serverAction } from "@/lib/use-cases/next";
import { acceptInvitation } from "@/lib/use-cases/invitations";

export const acceptInvitationAction = serverAction(acceptInvitation, {
  then: async (accepted, { password }) => {
    // nextCookies() sets the session cookie on this response.
    await auth.api.signInEmail({ body: { email: accepted.email, password }, headers: await headers() });
    redirect("/home");
  },
});
