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
import { APIError, createAuthMiddleware, getIP, isAPIError } from "better-auth/api";
import { nextCookies } from "better-auth/next-js";
import { eq } from "drizzle-orm";
import { db } from "@/db";
import { account, rateLimit, session, user, verification } from "@/db/schema";
import { recordAuditEvent } from "@/lib/data/audit";
import { consumeRateLimit } from "@/lib/data/rate-limit";
import { PASSWORD_MAX_LENGTH, PASSWORD_MIN_LENGTH } from "@/lib/domain/password-policy";
import { renderPasswordResetMail } from "@/lib/mail/templates";
import { enqueueJob } from "@/lib/jobs/enqueue";
import { serverEnv } from "@/lib/server-env";

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
export const PASSWORD_RESET_RATE_LIMIT = { window: 60, max: 3 };

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
  const source = ctx.request ?? ctx.headers;
  return source ? getIP(source, ctx.context.options) : null;
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
    // Behind a load balancer, name its addresses (GUSSET_TRUSTED_PROXIES="10.0.0.0/8,…") so the rate
    // limit keys on the client's address rather than one shared bucket.
    ipAddress: { trustedProxies: serverEnv().GUSSET_TRUSTED_PROXIES },
  },
  // Endpoints Gusset does not use are switched off: no self sign-up, and profile, e-mail and account
  // changes go through our own use cases (audited) or do not exist yet.
  disabledPaths: [
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

/** The e-mail a sign-in request names, from a JSON or form body; the request itself stays unread. */
async function readRequestEmail(request: Request): Promise<string | null> {
  const copy = request.clone();
  if ((copy.headers.get("content-type") ?? "").includes("application/x-www-form-urlencoded")) {
    const form = await copy.formData().catch(() => null);
    return readEmail({ email: form?.get("email") });
  }
  return readEmail(await copy.json().catch(() => null));
}

async function auditRateLimitedSignIn(email: string | null, ipAddress: string | null): Promise<void> {
  await auditFailedSignIn(email, "RATE_LIMITED", ipAddress).catch((error) =>
    console.error("[gusset] could not write the auth audit event:", error),
  );
}

function tooManyRequests(retryAfterSeconds: number): Response {
  return Response.json(
    { code: "TOO_MANY_REQUESTS", message: "Too many requests. Please try again later." },
    { status: 429, headers: { "X-Retry-After": String(retryAfterSeconds) } },
  );
}

/**
 * The HTTP entry for /api/auth/*. Sign-in attempts are first counted per account and address (see
 * SIGN_IN_RATE_LIMIT); every refused attempt, ours or better-auth's per-address one (answered before
 * any hook runs), is written to the audit trail here.
 */
export async function handleAuthRequest(request: Request): Promise<Response> {
  const isSignIn = request.method === "POST" && new URL(request.url).pathname.endsWith("/sign-in/email");
  if (!isSignIn) return auth.handler(request);
  const email = await readRequestEmail(request);
  const ipAddress = getIP(request, auth.options);
  if (email) {
    const decision = await consumeRateLimit({
      key: `sign-in|${ipAddress ?? "no-trusted-ip"}|${email}`,
      windowSeconds: SIGN_IN_RATE_LIMIT.window,
      max: SIGN_IN_RATE_LIMIT.max,
    });
    if (!decision.allowed) {
      await auditRateLimitedSignIn(email, ipAddress);
      return tooManyRequests(decision.retryAfterSeconds);
    }
  }
  const response = await auth.handler(request);
  if (response.status === 429) await auditRateLimitedSignIn(email, ipAddress);
  return response;
}
