import "server-only";
// Who is asking, for pages, server actions and route handlers. The only module that reads the
// request's headers; everything below it takes the actor as an argument.
import { headers } from "next/headers";
import { cache } from "react";
import { forbidden, redirect } from "next/navigation";
import type { Actor } from "@/lib/domain/actor";
import { can, type Action } from "@/lib/domain/permissions";
import { isRole } from "@/lib/domain/roles";
import { safePath } from "@/lib/domain/safe-path";
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
  return { id, name, email, role };
}

/** The client's address for this request (see lib/auth/client-address.ts), or null. */
export async function getClientAddress(): Promise<string | null> {
  return clientAddressFrom(await headers());
}

/** Read once per page render (layout and page share it through React's cache). */
export const getActor = cache(async (): Promise<Actor | null> => getActorFromHeaders(await headers()));

/**
 * For pages: an anonymous visitor is sent to sign in (and brought back afterwards); a signed-in person
 * whose role lacks the action gets the 403 page (app/forbidden.tsx).
 */
export async function requirePageActor(action?: Action, options?: { next?: string }): Promise<Actor> {
  const actor = await getActor();
  if (!actor) redirect(`/sign-in?next=${encodeURIComponent(safePath(currentPath(await headers()) ?? options?.next))}`);
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
