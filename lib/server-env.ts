// The server's settings, read from the environment once and checked with zod, so a missing or malformed
// value stops the server with a message that names it instead of surfacing as a wrong default later.
// `npm start` and `npm test` write these (scripts/lib/env.mjs); a deployment sets them itself.
// The only module that reads process.env for the application (scripts read their own).
import { z } from "zod";

const DEFAULT_APP_URL = "http://127.0.0.1:3000";

/** "a, b ,c" → ["a", "b", "c"]; empty entries dropped. */
const commaList = z
  .string()
  .optional()
  .transform((value) =>
    (value ?? "")
      .split(",")
      .map((item) => item.trim())
      .filter(Boolean),
  );

const positiveInt = (fallback: number) =>
  z
    .string()
    .optional()
    .transform((value, ctx) => {
      if (value === undefined || value.trim() === "") return fallback;
      const parsed = Number(value);
      if (!Number.isInteger(parsed) || parsed <= 0) {
        ctx.addIssue({ code: "custom", message: `expected a positive whole number, got "${value}"` });
        return z.NEVER;
      }
      return parsed;
    });

const URL_MESSAGE = "must be a URL such as http://127.0.0.1:3000";

const optionalUrl = z
  .url(URL_MESSAGE)
  .optional()
  .or(z.literal("").transform(() => undefined));

const envSchema = z.object({
  NODE_ENV: z.enum(["development", "production", "test"]).default("development"),
  /** PostgreSQL connection string for the app's own login. Required wherever the database is used. */
  DATABASE_URL: z.string().min(1).optional(),
  /** The app's public address: links in e-mails, trusted origins. */
  BETTER_AUTH_URL: z.url(URL_MESSAGE).default(DEFAULT_APP_URL),
  /** Signs session cookies; at least 32 characters. */
  BETTER_AUTH_SECRET: z.string().min(32, "must be at least 32 characters").optional(),
  SMTP_HOST: z.string().min(1).default("127.0.0.1"),
  SMTP_PORT: positiveInt(2525),
  MAIL_FROM: z.string().min(3).default("Gusset <no-reply@gusset.example>"),
  /** Set only while the demo's fake SMTP server is in use: the admin's demo mailbox reads it. */
  FAKE_MAIL_API_URL: optionalUrl,
  S3_ENDPOINT: optionalUrl,
  S3_REGION: z.string().min(1).default("us-east-1"),
  S3_BUCKET: z.string().min(1).optional(),
  S3_ACCESS_KEY_ID: z.string().min(1).optional(),
  S3_SECRET_ACCESS_KEY: z.string().min(1).optional(),
  /** The Chromium that renders calc sheets to PDF (Debian's package). */
  CHROMIUM_PATH: z.string().min(1).default("/usr/bin/chromium"),
  /**
   * Where the server's own Chromium loads a calc sheet from, when not the app's public address (behind a proxy
   * that terminates TLS: the app's loopback address, e.g. http://localhost:3000).
   */
  GUSSET_RENDER_URL: optionalUrl,
  /**
   * The id of the app's build being served (scripts/serve.mjs reads it from .next/BUILD_ID). Part of a calc sheet's
   * key: a kept PDF is served without opening Chromium only for the build that drew it. Unset (next dev, a script):
   * every sheet PDF is checked in Chromium.
   */
  GUSSET_BUILD_ID: z.string().trim().min(1).max(200).optional(),
  /** The log's Ed25519 private key, PKCS #8 DER in base64: only the worker, which seals tree heads, needs it. */
  GUSSET_LOG_SIGNING_KEY: z.string().min(40).optional(),
  /** The log's public key, SPKI DER in base64: every head is checked against it (derived from the private key if unset). */
  GUSSET_LOG_PUBLIC_KEY: z.string().min(40).optional(),
  /** The QA witness's address: each new tree head's digest is e-mailed there, so heads leave the server. */
  GUSSET_WITNESS_EMAIL: z
    .email("must be an e-mail address")
    .optional()
    .or(z.literal("").transform(() => undefined)),
  /** How often the sealer folds new leaves into the tree, in milliseconds. */
  GUSSET_SEAL_INTERVAL_MS: positiveInt(3000),
  /** Sign-in attempts per account and client address per minute. */
  GUSSET_SIGN_IN_RATE_LIMIT_MAX: positiveInt(5),
  /** The load balancer's addresses: only from these is X-Forwarded-For believed (read by scripts/serve.mjs). */
  GUSSET_TRUSTED_PROXIES: commaList,
  /**
   * Set to "1" by scripts/serve.mjs, which writes the client's address into x-gusset-client-address. Under
   * any other server that header could come from the client, so it is not read and no address is recorded.
   */
  GUSSET_CLIENT_ADDRESS_FROM_SERVER: z.literal("1").optional(),
});

export type ServerEnv = z.infer<typeof envSchema>;

let cached: ServerEnv | null = null;

/** The parsed settings; parsed on first use and kept. Throws once, naming every bad variable. */
export function serverEnv(): ServerEnv {
  if (cached) return cached;
  const parsed = envSchema.safeParse(process.env);
  if (!parsed.success) {
    const problems = parsed.error.issues.map((issue) => `  ${issue.path.join(".")}: ${issue.message}`).join("\n");
    throw new Error(`Gusset's settings are not valid (npm start and npm test write them):\n${problems}`);
  }
  cached = parsed.data;
  return cached;
}

/** A setting that the code path needs; throws naming it when it is not set. */
export function requireSetting<K extends keyof ServerEnv>(name: K): NonNullable<ServerEnv[K]> {
  const value = serverEnv()[name];
  if (value === undefined || value === null) throw new Error(`${name} is not set (npm start and npm test set it).`);
  return value as NonNullable<ServerEnv[K]>;
}

/** The app's base URL without a trailing slash, for links in e-mails. */
export function appBaseUrl(): string {
  return serverEnv().BETTER_AUTH_URL.replace(/\/+$/, "");
}

/** For tests that change process.env on purpose: the next serverEnv() reads it again. */
export function forgetServerEnv(): void {
  cached = null;
}
