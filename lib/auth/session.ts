import "server-only";
// Who is asking, for pages, server actions and route handlers. The only module that reads the
// request's headers; everything below it takes the actor as an argument.
import { getSessionCookie } from "better-auth/cookies";
import { headers } from "next/headers";
import { cache } from "react";
import { forbidden, redirect } from "next/navigation";
import type { Actor } from "@/lib/domain/actor";
import { can, type Action } from "@/lib/domain/permissions";
import { isRole } from "@/lib/domain/roles";
import { safePath } from "@/lib/domain/safe-path";
import type { SignInReason } from "@/lib/domain/schemas/sign-in";
import { findSessionEndReason } from "@/lib/data/sessions";
import { clientAddressFrom } from "./client-address";
import { auth } from "./server";

export type { Actor } from "@/lib/domain/actor";

/** The signed-in person for these request headers, or null (no session, expired, or deactivated). */
export async function getActorFromHeaders(requestHeaders: Headers): Promise<Actor | null> {
  const current = await auth.api.getSession({ headers: requestHeaders });
  if (!current) return null;
  const { id, name, email, role, deactivatedAt } = current.user;
  // Sessions are deleted on deactivation; this is the second lock in case one slipped through.
  if (deactivatedAt || !isRole(role)) return null;
  return { id, name, email, role, sessionId: current.session.id };
}

/** The client's address for this request (see lib/auth/client-address.ts), or null. */
export async function getClientAddress(): Promise<string | null> {
  return clientAddressFrom(await headers());
}

/** Read once per page render (layout and page share it through React's cache). */
export const getActor = cache(async (): Promise<Actor | null> => getActorFromHeaders(await headers()));

/**
 * Why the browser's session cookie no longer signs anyone in, when it was ended on purpose (deactivation,
 * a password change elsewhere); null for no cookie, a forged or expired one, or a plain sign-out.
 */
export async function getSessionEndReason(requestHeaders: Headers): Promise<SignInReason | null> {
  const cookie = getSessionCookie(requestHeaders);
  if (!cookie) return null;
  // The cookie is "<token>.<signature>"; only the token was stored (as a hash) when the session ended.
  const token = decodeURIComponent(cookie).split(".")[0];
  return token ? findSessionEndReason(token) : null;
}

/**
 * For pages: an anonymous visitor is sent to sign in (and brought back afterwards), told why when their
 * session was ended on purpose; a signed-in person whose role lacks the action gets the 403 page
 * (app/forbidden.tsx), which names their role and the roles the page is for.
 */
export async function requirePageActor(action?: Action, options?: { next?: string }): Promise<Actor> {
  const actor = await getActor();
  if (!actor) {
    const requestHeaders = await headers();
    const reason = await getSessionEndReason(requestHeaders);
    const next = encodeURIComponent(safePath(currentPath(requestHeaders) ?? options?.next));
    redirect(reason ? `/sign-in?reason=${reason}&next=${next}` : `/sign-in?next=${next}`);
  }
  if (action && !can(actor.role, action)) forbidden();
  return actor;
}

/**
 * The path being viewed, with its query, for the sign-in page's ?next=. Next does not hand a page its own
 * URL; proxy.ts passes it on as x-gusset-path (replacing any the client sent). Without it, the page's own
 * `next` or home.
 */
function currentPath(requestHeaders: Headers): string | null {
  return requestHeaders.get("x-gusset-path");
}
