import "server-only";
// The better-auth instance: e-mail + password only, sessions and rate-limit counters in PostgreSQL.
// Nobody signs up: people join by invitation (lib/data/invitations.ts). The admin plugin is left out on
// purpose: its endpoints would change roles and bans without our use cases and audit trail.
//
// Its HTTP endpoints are mounted at /api/auth/* (app/api/auth/[...all]/route.ts). That is the one route
// that is not one of our use cases (lib/use-cases): it is the auth library's own endpoint set, protected by
// better-auth itself (sign-up disabled, rate limits, origin check) plus the hooks below.
import { betterAuth } from "better-auth";
import { drizzleAdapter } from "better-auth/adapters/drizzle";
import { APIError, createAuthMiddleware, isAPIError } from "better-auth/api";
import { nextCookies } from "better-auth/next-js";
import { after } from "next/server";
import { z } from "zod";
import { eq } from "drizzle-orm";
import { db } from "@/db";
import { account, rateLimit, session, user, verification } from "@/db/schema";
import { recordAuditEvent } from "@/lib/data/audit";
import { clearRateLimit, consumeRateLimit } from "@/lib/data/rate-limit";
import { PASSWORD_MAX_LENGTH, PASSWORD_MIN_LENGTH } from "@/lib/domain/password-policy";
import { renderPasswordResetMail } from "@/lib/mail/templates";
import { enqueueJob } from "@/lib/jobs/enqueue";
import { serverEnv } from "@/lib/server-env";
import { ACCOUNT_LOCKED_MESSAGE } from "@/lib/domain/auth-messages";
import { bodyHasControlCharacters } from "@/lib/domain/schemas/text";
import { CLIENT_ADDRESS_HEADER, clientAddressFrom } from "./client-address";
import { jsonResponse } from "@/lib/domain/json-response";

export const ACCOUNT_DEACTIVATED_CODE = "ACCOUNT_DEACTIVATED";
export const ACCOUNT_DEACTIVATED_MESSAGE = "This account has been deactivated. Ask your admin to reactivate it.";

/**
 * Sign-in attempts per minute for one account from one client address (successful ones count too).
 * Checked in handleAuthRequest: better-auth keys its limits on the address alone, and a whole office
 * behind one NAT address would lock itself out at 9 a.m. GUSSET_SIGN_IN_RATE_LIMIT_MAX may change it.
 */
export const SIGN_IN_RATE_LIMIT = { window: 60, max: serverEnv().GUSSET_SIGN_IN_RATE_LIMIT_MAX };
/** All sign-in attempts from one client address per minute, whatever the account (better-auth's rule). */
export const SIGN_IN_ADDRESS_RATE_LIMIT = { window: 60, max: 30 };
/**
 * Sign-in attempts for one account in 15 minutes, from any address, counted until one succeeds. An attacker
 * who rotates addresses still stops here. Unknown e-mails are counted the same way, so the lock-out says
 * nothing about whether an account exists.
 */
export const ACCOUNT_SIGN_IN_LIMIT = { window: 15 * 60, max: 10 };
export const ACCOUNT_LOCKED_CODE = "ACCOUNT_LOCKED";
export { ACCOUNT_LOCKED_MESSAGE };
/** Reset requests from one client address per minute. */
export const PASSWORD_RESET_RATE_LIMIT = { window: 60, max: 3 };
/** Reset e-mails to one address per hour: more requests are answered the same way but send nothing. */
export const PASSWORD_RESET_EMAIL_LIMIT = { window: 60 * 60, max: 3 };

function getBaseUrl(): string {
  return serverEnv().BETTER_AUTH_URL;
}

/** 127.0.0.1 and localhost are the same machine to a person; accept both as origins for the demo. */
function getTrustedOrigins(): string[] {
  const base = new URL(getBaseUrl());
  const origins = [base.origin];
  for (const [from, to] of [
    ["127.0.0.1", "localhost"],
    ["localhost", "127.0.0.1"],
  ] as const) {
    if (base.hostname === from) origins.push(`${base.protocol}//${to}${base.port ? `:${base.port}` : ""}`);
  }
  return origins;
}

async function findUserByEmail(email: string) {
  const [row] = await db
    .select({ id: user.id, name: user.name, deactivatedAt: user.deactivatedAt })
    .from(user)
    .where(eq(user.email, email.trim().toLowerCase()));
  return row ?? null;
}

type HookContext = Parameters<Parameters<typeof createAuthMiddleware>[0]>[0];

function getClientIp(ctx: HookContext): string | null {
  const source = ctx.request?.headers ?? ctx.headers;
  return source ? clientAddressFrom(source) : null;
}

function readEmail(body: unknown): string | null {
  const email = (body as { email?: unknown } | undefined)?.email;
  return typeof email === "string" ? email.trim().toLowerCase().slice(0, 320) : null;
}

/** An event about the account a request names by e-mail; `knownUser` says whether there is one. */
type EmailEvent =
  | { action: "auth.sign-in.failed"; details: { reason: string } }
  | { action: "auth.password-reset.requested"; details: { reason?: string } };

async function auditForEmail(event: EmailEvent, email: string | null, ipAddress: string | null): Promise<void> {
  const known = email ? await findUserByEmail(email) : null;
  const common = { actorId: known?.id ?? null, actorEmail: email, subject: known ? `user:${known.id}` : null, ipAddress };
  const knownUser = Boolean(known);
  await recordAuditEvent(
    event.action === "auth.sign-in.failed"
      ? { ...common, action: event.action, details: { ...event.details, knownUser } }
      : { ...common, action: event.action, details: { ...event.details, knownUser } },
  );
}

/** `reason` is better-auth's error code (INVALID_EMAIL_OR_PASSWORD, ACCOUNT_DEACTIVATED, …) or RATE_LIMITED. */
async function auditFailedSignIn(email: string | null, reason: string, ipAddress: string | null): Promise<void> {
  await auditForEmail({ action: "auth.sign-in.failed", details: { reason } }, email, ipAddress);
}

/** Audit trail for sign-in attempts and password resets, read from what the endpoint returned. */
async function auditAuthEndpoint(ctx: HookContext): Promise<void> {
  const returned = ctx.context.returned;
  const failed = isAPIError(returned);
  const ipAddress = getClientIp(ctx);
  if (ctx.path === "/sign-in/email") {
    const email = readEmail(ctx.body);
    if (!failed) {
      const signedIn = ctx.context.newSession?.user;
      await recordAuditEvent({
        action: "auth.sign-in",
        actorId: signedIn?.id,
        actorEmail: signedIn?.email ?? email,
        subject: signedIn ? `user:${signedIn.id}` : null,
        details: {},
        ipAddress,
      });
      return;
    }
    await auditFailedSignIn(email, (returned as APIError).body?.code ?? "UNKNOWN", ipAddress);
  } else if (ctx.path === "/request-password-reset") {
    const details = failed ? { reason: (returned as APIError).body?.code ?? "UNKNOWN" } : {};
    await auditForEmail({ action: "auth.password-reset.requested", details }, readEmail(ctx.body), ipAddress);
  } else if (ctx.path === "/reset-password" && failed) {
    await recordAuditEvent({
      action: "auth.password-reset.failed",
      details: { reason: (returned as APIError).body?.code ?? "UNKNOWN" },
      ipAddress,
    });
  }
}

export const auth = betterAuth({
  appName: "Gusset",
  baseURL: getBaseUrl(),
  secret: serverEnv().BETTER_AUTH_SECRET,
  trustedOrigins: getTrustedOrigins(),
  // better-auth skips the origin check when NODE_ENV is "test"; Gusset checks it everywhere, so the
  // tests exercise what production does.
  advanced: {
    disableOriginCheck: false,
    // The client's address is the one scripts/serve.mjs resolved from the connection (trusting
    // X-Forwarded-For only from GUSSET_TRUSTED_PROXIES); under any other server there is none to believe.
    ipAddress: {
      ipAddressHeaders: [CLIENT_ADDRESS_HEADER],
      disableIpTracking: serverEnv().GUSSET_CLIENT_ADDRESS_FROM_SERVER !== "1",
    },
  },
  // Endpoints Gusset does not use are switched off: no self sign-up, and profile, e-mail and account
  // changes go through our own use cases (audited) or do not exist yet.
  disabledPaths: [
    // Password changes happen by reset link only, which is audited and ends every session.
    "/change-password",
    "/verify-password",
    "/reset-password/:token",
    "/list-sessions",
    "/revoke-session",
    "/revoke-sessions",
    "/revoke-other-sessions",
    "/update-session",
    "/list-accounts",
    "/account-info",
    "/get-access-token",
    "/refresh-token",
    "/sign-up/email",
    "/sign-in/social",
    "/update-user",
    "/delete-user",
    "/delete-user/callback",
    "/change-email",
    "/link-social",
    "/unlink-account",
    "/send-verification-email",
    "/verify-email",
  ],
  // Failed sign-ins are in the audit trail already; keep test output readable.
  logger: { level: serverEnv().NODE_ENV === "test" ? "error" : "warn" },
  database: drizzleAdapter(db, {
    provider: "pg",
    schema: { user, session, account, verification, rateLimit },
    transaction: true,
  }),
  emailAndPassword: {
    enabled: true,
    disableSignUp: true,
    minPasswordLength: PASSWORD_MIN_LENGTH,
    maxPasswordLength: PASSWORD_MAX_LENGTH,
    revokeSessionsOnPasswordReset: true,
    resetPasswordTokenExpiresIn: 60 * 60,
    async sendResetPassword({ user: recipient, token }) {
      const known = await findUserByEmail(recipient.email);
      if (!known || known.deactivatedAt) return; // a deactivated account gets no reset link
      // Our own page (app/(auth)/reset-password) takes the token, not better-auth's redirect endpoint.
      const url = `${getBaseUrl()}/reset-password?token=${encodeURIComponent(token)}`;
      // Queued, not sent here: the worker sends it (with retries) outside this request.
      await enqueueJob("mail.send", renderPasswordResetMail({ to: recipient.email, name: recipient.name, url }));
    },
    async onPasswordReset({ user: changed }) {
      await recordAuditEvent({
        action: "auth.password-reset",
        actorId: changed.id,
        actorEmail: changed.email,
        subject: `user:${changed.id}`,
        details: {},
      });
    },
  },
  user: {
    additionalFields: {
      role: { type: "string", required: false, defaultValue: "engineer", input: false },
      deactivatedAt: { type: "date", required: false, input: false },
    },
  },
  session: {
    // No cookie cache: every request reads the session row, so deleting it (deactivation) ends it at once.
    cookieCache: { enabled: false },
  },
  rateLimit: {
    enabled: true,
    storage: "database",
    modelName: "rateLimit",
    customRules: {
      "/sign-in/email": SIGN_IN_ADDRESS_RATE_LIMIT,
      "/request-password-reset": PASSWORD_RESET_RATE_LIMIT,
      "/reset-password": { window: 60, max: 10 },
    },
  },
  databaseHooks: {
    session: {
      create: {
        // Runs after the password was verified, so the message reveals nothing to a stranger.
        async before(newSession) {
          const [row] = await db.select({ deactivatedAt: user.deactivatedAt }).from(user).where(eq(user.id, newSession.userId));
          if (!row || row.deactivatedAt) {
            throw APIError.from("FORBIDDEN", { code: ACCOUNT_DEACTIVATED_CODE, message: ACCOUNT_DEACTIVATED_MESSAGE });
          }
        },
      },
    },
  },
  hooks: {
    after: createAuthMiddleware(async (ctx) => {
      try {
        await auditAuthEndpoint(ctx);
      } catch (error) {
        // An audit failure must not turn a good sign-in into an error page; it is logged for the admin.
        console.error("[gusset] could not write the auth audit event:", error);
      }
    }),
  },
  plugins: [nextCookies()],
});

export type Auth = typeof auth;

/** The body of a sign-in or reset request, JSON or form, read from a copy so the request stays unread. */
async function readRequestBody(request: Request): Promise<Record<string, unknown> | null> {
  const copy = request.clone();
  if ((copy.headers.get("content-type") ?? "").includes("application/x-www-form-urlencoded")) {
    const form = await copy.formData().catch(() => null);
    return form ? Object.fromEntries(form.entries()) : null;
  }
  const body: unknown = await copy.json().catch(() => null);
  return body && typeof body === "object" ? (body as Record<string, unknown>) : null;
}

function logAuditFailure(error: unknown): void {
  console.error("[gusset] could not write the auth audit event:", error);
}

function refusal(status: number, code: string, message: string, headers?: HeadersInit): Response {
  return jsonResponse({ code, message }, { status, headers });
}

function tooManyRequests(retryAfterSeconds: number): Response {
  const wait = String(retryAfterSeconds);
  return refusal(429, "TOO_MANY_REQUESTS", "Too many requests. Please try again later.", {
    "Retry-After": wait,
    "X-Retry-After": wait,
  });
}

export const FOREIGN_ORIGIN_MESSAGE = "This page's address does not match Gusset's. Reload and try again.";

/**
 * Every POST to /api/auth/* must come from one of Gusset's own pages. better-auth checks this for sign-in
 * but not for every endpoint (a reset request from another site was answered), so it is checked here first.
 */
function fromOwnOrigin(request: Request): boolean {
  const origin = request.headers.get("origin");
  return origin !== null && getTrustedOrigins().includes(origin);
}

/** What every POST handler here gets: the request (still unread), its body read once, and the client's address. */
type AuthPost = { request: Request; body: Record<string, unknown> | null; ipAddress: string | null };

async function handleSignIn({ request, body, ipAddress }: AuthPost): Promise<Response> {
  const email = readEmail(body);
  if (email) {
    const perAddress = await consumeRateLimit({
      key: `sign-in|${ipAddress ?? "no-address"}|${email}`,
      windowSeconds: SIGN_IN_RATE_LIMIT.window,
      max: SIGN_IN_RATE_LIMIT.max,
    });
    if (!perAddress.allowed) {
      await auditFailedSignIn(email, "RATE_LIMITED", ipAddress).catch(logAuditFailure);
      return tooManyRequests(perAddress.retryAfterSeconds);
    }
    const perAccount = await consumeRateLimit({
      key: `sign-in-account|${email}`,
      windowSeconds: ACCOUNT_SIGN_IN_LIMIT.window,
      max: ACCOUNT_SIGN_IN_LIMIT.max,
    });
    if (!perAccount.allowed) {
      await auditFailedSignIn(email, ACCOUNT_LOCKED_CODE, ipAddress).catch(logAuditFailure);
      return refusal(429, ACCOUNT_LOCKED_CODE, ACCOUNT_LOCKED_MESSAGE, { "Retry-After": String(perAccount.retryAfterSeconds) });
    }
  }
  const response = await auth.handler(request);
  if (response.status === 429) await auditFailedSignIn(email, "RATE_LIMITED", ipAddress).catch(logAuditFailure);
  // A successful sign-in ends the count of failed ones for the account.
  if (email && response.ok) await clearRateLimit(`sign-in-account|${email}`);
  return response;
}

const resetRequestSchema = z.object({
  email: z.string().trim().toLowerCase().max(254).pipe(z.email()),
  redirectTo: z.string().max(200).optional(),
});

/** What better-auth answers to every reset request; Gusset answers it itself, before any look-up. */
export const RESET_REQUESTED_MESSAGE = "If this email exists in our system, check your email for the reset link";

/**
 * A reset request is answered at once, the same way and after the same work whether or not the address
 * has an account (checks, two counters); the look-up, the token and the queued e-mail happen after the
 * answer has gone (Next's after()), so the answer's timing says nothing about the address.
 */
async function handlePasswordResetRequest({ request, body, ipAddress }: AuthPost): Promise<Response> {
  const parsed = resetRequestSchema.safeParse(body);
  if (!parsed.success) return refusal(400, "INVALID_EMAIL", "Enter an e-mail address like name@firm.example.");
  const { email } = parsed.data;
  const perAddress = await consumeRateLimit({
    key: `password-reset|${ipAddress ?? "no-address"}`,
    windowSeconds: PASSWORD_RESET_RATE_LIMIT.window,
    max: PASSWORD_RESET_RATE_LIMIT.max,
  });
  if (!perAddress.allowed) {
    await auditForEmail({ action: "auth.password-reset.requested", details: { reason: "RATE_LIMITED" } }, email, ipAddress).catch(
      logAuditFailure,
    );
    return tooManyRequests(perAddress.retryAfterSeconds);
  }
  const perEmail = await consumeRateLimit({
    key: `password-reset-email|${email}`,
    windowSeconds: PASSWORD_RESET_EMAIL_LIMIT.window,
    max: PASSWORD_RESET_EMAIL_LIMIT.max,
  });
  const forward = new Request(request.url, { method: "POST", headers: request.headers, body: JSON.stringify(parsed.data) });
  await afterAnswer(async () => {
    try {
      if (perEmail.allowed) await auth.handler(forward);
      else
        await auditForEmail(
          { action: "auth.password-reset.requested", details: { reason: "EMAIL_RATE_LIMITED" } },
          email,
          ipAddress,
        );
    } catch (error) {
      console.error("[gusset] a password-reset request failed after it was answered:", error);
    }
  });
  return jsonResponse({ status: true, message: RESET_REQUESTED_MESSAGE });
}

/**
 * Runs `work` once the answer has gone (Next's after()). Outside a request (integration tests call the
 * handler in-process, scripts) there is no answer to wait for, so it runs before returning.
 */
async function afterAnswer(work: () => Promise<void>): Promise<void> {
  try {
    after(work);
  } catch (error) {
    if (!(error instanceof Error && error.message.includes("outside a request scope"))) throw error;
    await work();
  }
}

/**
 * The HTTP entry for /api/auth/*. Every POST is checked for Gusset's own origin; sign-in attempts are
 * counted per account and address (SIGN_IN_RATE_LIMIT) and per account alone (ACCOUNT_SIGN_IN_LIMIT);
 * reset requests are answered before any look-up. Every refusal is written to the audit trail.
 */
export async function handleAuthRequest(request: Request): Promise<Response> {
  if (request.method !== "POST") return auth.handler(request);
  const path = new URL(request.url).pathname.replace(/^\/api\/auth/, "");
  const ipAddress = clientAddressFrom(request.headers);
  const body = await readRequestBody(request);
  if (!fromOwnOrigin(request)) {
    const email = readEmail(body);
    if (path === "/sign-in/email") await auditFailedSignIn(email, "INVALID_ORIGIN", ipAddress).catch(logAuditFailure);
    else if (path === "/request-password-reset") {
      await auditForEmail(
        { action: "auth.password-reset.requested", details: { reason: "INVALID_ORIGIN" } },
        email,
        ipAddress,
      ).catch(logAuditFailure);
    }
    return refusal(403, "INVALID_ORIGIN", FOREIGN_ORIGIN_MESSAGE);
  }
  // A NUL byte cannot even be looked up in PostgreSQL text; no field of these forms may hold control characters.
  if (bodyHasControlCharacters(body)) {
    return refusal(400, "INVALID_CHARACTERS", "Remove the control characters from what you typed and try again.");
  }
  if (path === "/sign-in/email") return handleSignIn({ request, body, ipAddress });
  if (path === "/request-password-reset") return handlePasswordResetRequest({ request, body, ipAddress });
  return auth.handler(request);
}
