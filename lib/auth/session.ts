import "server-only";
// Who is asking, for pages, server actions and route handlers. The only module that reads the
// request's headers; everything below it takes the actor as an argument.
import { createHmac, timingSafeEqual } from "node:crypto";
import { getSessionCookie, parseCookies } from "better-auth/cookies";
import { headers } from "next/headers";
import { cache } from "react";
import { forbidden, redirect } from "next/navigation";
import type { Actor } from "@/lib/domain/actor";
import { can, type Action } from "@/lib/domain/permissions";
import { isRole } from "@/lib/domain/roles";
import { safePath } from "@/lib/domain/safe-path";
import type { SignInReason } from "@/lib/domain/schemas/sign-in";
import { findSessionEndReason, findSessionWithUser } from "@/lib/data/sessions";
import { clientAddressFrom } from "./client-address";
import { auth } from "./server";

export type { Actor } from "@/lib/domain/actor";

/** The signed-in person for these request headers, or null (no session, expired, or deactivated). */
export async function getActorFromHeaders(requestHeaders: Headers): Promise<Actor | null> {
  const exact = await readLiveSession(requestHeaders);
  if (exact !== ASK_BETTER_AUTH) return exact;
  if (liveSessionsOnly) throw new HandToNext();
  const current = await auth.api.getSession({ headers: requestHeaders });
  if (!current) return null;
  const { id, name, email, role, deactivatedAt } = current.user;
  // Sessions are deleted on deactivation; this is the second lock in case one slipped through.
  if (deactivatedAt || !isRole(role)) return null;
  return { id, name, email, role, sessionId: current.session.id };
}

const ASK_BETTER_AUTH = Symbol("ask better-auth");

/**
 * Thrown, before anything else is read, by a route served outside Next (scripts/direct-routes.ts) for a request whose
 * session only better-auth can answer: its answer may refresh the session's cookie, which better-auth sets through
 * Next (nextCookies). The server hands the request, its body unread, to Next instead.
 */
export class HandToNext extends Error {
  constructor() {
    super("this request's session is answered by better-auth, through Next");
    this.name = "HandToNext";
  }
}

let liveSessionsOnly = false;

/** For the bundle of routes served outside Next alone (scripts/direct-routes.ts): see HandToNext. */
export function answerLiveSessionsOnly(): void {
  liveSessionsOnly = true;
}

/**
 * The common case of every signed-in request, answered exactly as better-auth's getSession would answer it, at a
 * fraction of its cost (its endpoint machinery, a Web Crypto key imported per request, and two queries): the session
 * cookie's signature checked with node:crypto, then the session and its person read in one query, every request (so
 * a deleted session, a deactivation or a new role counts at once). Whatever better-auth would answer with a cookie
 * change — an unknown or expired session, one due for its sliding refresh, a stale cookie cache, a bad signature —
 * is handed to better-auth itself (ASK_BETTER_AUTH). No cookie at all is nobody, as it is for better-auth.
 */
async function readLiveSession(requestHeaders: Headers): Promise<Actor | null | typeof ASK_BETTER_AUTH> {
  const header = requestHeaders.get("cookie");
  if (!header) return null;
  const context = await auth.$context;
  const cookies = parseCookies(header);
  const cookieCache = context.authCookies.sessionData.name;
  if ([...cookies.keys()].some((name) => name === cookieCache || name.startsWith(`${cookieCache}.`))) return ASK_BETTER_AUTH;
  const signed = cookies.get(context.authCookies.sessionToken.name);
  if (!signed) return null;
  const dot = signed.lastIndexOf(".");
  const token = signed.slice(0, dot);
  // The signature as better-call writes it: standard base64 of HMAC-SHA256(secret, token), compared as text.
  const signature = Buffer.from(signed.slice(dot + 1));
  const expected = Buffer.from(createHmac("sha256", context.secret).update(token).digest("base64"));
  if (dot < 1 || signature.length !== expected.length || !timingSafeEqual(signature, expected)) return ASK_BETTER_AUTH;
  const row = await findSessionWithUser(token);
  const now = Date.now();
  if (!row || row.expiresAt.getTime() < now) return ASK_BETTER_AUTH;
  const { expiresIn, updateAge } = context.sessionConfig;
  if (row.expiresAt.getTime() - expiresIn * 1000 + updateAge * 1000 <= now) return ASK_BETTER_AUTH;
  // Sessions are deleted on deactivation; this is the second lock in case one slipped through.
  if (row.deactivatedAt || !isRole(row.role)) return null;
  return { id: row.userId, name: row.name, email: row.email, role: row.role, sessionId: row.sessionId };
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
