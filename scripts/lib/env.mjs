// Where local state lives, which ports each profile uses, and the environment given to Next, the
// migrations, the seed and vitest. This is the contract the rest of the code base reads.
import crypto from "node:crypto";
import fs from "node:fs";
import os from "node:os";
import path from "node:path";
import { fileURLToPath } from "node:url";

export const repoRoot = path.resolve(path.dirname(fileURLToPath(import.meta.url)), "..", "..");

// GUSSET_PORT_OFFSET shifts every port, for a second checkout on the same machine. Off by default.
const offset = Number.parseInt(process.env.GUSSET_PORT_OFFSET ?? "0", 10) || 0;

const PORTS = {
  start: { postgres: 54329, smtp: 2525, mailApi: 2580, s3: 4569, app: 3000 },
  test: { postgres: 54329, smtp: 2526, mailApi: 2581, s3: 4570, app: 3100 },
};

const DATABASES = { start: "gusset", test: "gusset_test" };

export function portsFor(profile) {
  return Object.fromEntries(Object.entries(PORTS[profile]).map(([name, port]) => [name, port + offset]));
}

export function databaseFor(profile) {
  return DATABASES[profile];
}

/**
 * The two PostgreSQL roles: the owner runs the migrations and owns every table; the app (the Next
 * server, the worker, the seed) logs in as a role that may only read and write rows. Neither is a
 * superuser. Both log in over loopback without a password, like `postgres` (the cluster trusts 127.0.0.1).
 */
export const DATABASE_ROLES = { owner: "gusset_owner", app: "gusset_app" };

/** `role`: "app", "owner", or "superuser" (`postgres`, for set-up and test fixtures only). */
export function databaseUrlFor(profile, role, database = databaseFor(profile)) {
  const user = role === "superuser" ? "postgres" : DATABASE_ROLES[role];
  return `postgres://${user}@127.0.0.1:${portsFor(profile).postgres}/${database}`;
}

/** What the migrations read on top of the app's variables: the owner's connection. */
export function migrationEnv(profile) {
  return { DATABASE_OWNER_URL: databaseUrlFor(profile, "owner") };
}

/**
 * The state folder: `.gusset/` at the repo root, unless PostgreSQL (run as the `postgres` user when we
 * are root) could not reach it because a parent folder is closed to others; then a folder under /tmp
 * named after the repo path, so each checkout keeps its own.
 */
export function resolveStateDir({ asRoot }) {
  const inRepo = path.join(repoRoot, ".gusset");
  if (!asRoot || everyFolderTraversable(repoRoot)) return { dir: inRepo, fallback: false };
  const hash = crypto.createHash("sha256").update(repoRoot).digest("hex").slice(0, 12);
  return { dir: path.join(os.tmpdir(), `gusset-${hash}`), fallback: true };
}

function everyFolderTraversable(folder) {
  for (let current = folder; ; current = path.dirname(current)) {
    const mode = fs.statSync(current).mode;
    if ((mode & 0o001) === 0) return false;
    if (path.dirname(current) === current) return true;
  }
}

export function stateLayout(stateDir) {
  return {
    root: stateDir,
    pgData: path.join(stateDir, "postgres", "data"),
    pgLog: path.join(stateDir, "postgres", "postgres.log"),
    s3: path.join(stateDir, "s3"),
    logs: path.join(stateDir, "logs"),
    run: path.join(stateDir, "run"),
  };
}

const envLocalPath = path.join(repoRoot, ".env.local");

function readEnvLocal() {
  if (!fs.existsSync(envLocalPath)) return new Map();
  const entries = new Map();
  for (const line of fs.readFileSync(envLocalPath, "utf8").split("\n")) {
    const match = /^\s*([A-Za-z_][A-Za-z0-9_]*)\s*=\s*(.*)$/.exec(line);
    if (match) entries.set(match[1], match[2].replace(/^"(.*)"$/, "$1"));
  }
  return entries;
}

/** Sets, from .env.local, every variable the environment does not already give: for scripts run by hand. */
export function loadEnvLocalDefaults() {
  for (const [key, value] of readEnvLocal()) if (process.env[key] === undefined) process.env[key] = value;
}

/** The local auth secret: the one in .env.local when there is one, else a new random one. */
export function authSecret() {
  const existing = readEnvLocal().get("BETTER_AUTH_SECRET");
  if (existing && existing.length >= 32) return { secret: existing, created: false };
  return { secret: crypto.randomBytes(36).toString("base64url"), created: true };
}

/**
 * The log's Ed25519 signing key (PKCS #8 DER, base64): the one in .env.local when there is one, else a new one.
 * Created once at first start, like the auth secret; every tree head is signed with it, so keep it with backups.
 */
export function logSigningKey() {
  const existing = readEnvLocal().get("GUSSET_LOG_SIGNING_KEY");
  if (existing && existing.length > 40) return { key: existing, created: false };
  const { privateKey } = crypto.generateKeyPairSync("ed25519");
  return { key: privateKey.export({ type: "pkcs8", format: "der" }).toString("base64"), created: true };
}

/** The public half of a signing key from logSigningKey, as one line of base64 SPKI DER. */
export function logPublicKey(signingKey) {
  const privateKey = crypto.createPrivateKey({ key: Buffer.from(signingKey, "base64"), format: "der", type: "pkcs8" });
  return crypto.createPublicKey(privateKey).export({ type: "spki", format: "der" }).toString("base64");
}

/**
 * The variables every Gusset process reads; DATABASE_URL is the app's role. The owner's URL is not among
 * them (see migrationEnv): only the migrations get it. `fakeMail` is false when a real SMTP server is configured.
 */
export function gussetEnv(profile, { secret, logKey = logSigningKey().key, fakeMail = true }) {
  const ports = portsFor(profile);
  const appUrl = `http://127.0.0.1:${ports.app}`;
  const env = {
    // Only the worker (the sealer) needs the private key; a deployment gives the web server the public key alone.
    GUSSET_LOG_SIGNING_KEY: logKey,
    GUSSET_LOG_PUBLIC_KEY: logPublicKey(logKey),
    // Each new tree head's digest goes to this QA witness mailbox (the fake SMTP in the demo and tests).
    GUSSET_WITNESS_EMAIL: "qa-witness@marrowby-fenn.example",
    DATABASE_URL: databaseUrlFor(profile, "app"),
    BETTER_AUTH_SECRET: secret,
    BETTER_AUTH_URL: appUrl,
    SMTP_HOST: "127.0.0.1",
    SMTP_PORT: String(ports.smtp),
    MAIL_FROM: "Gusset <no-reply@gusset.example>",
    S3_ENDPOINT: `http://127.0.0.1:${ports.s3}`,
    S3_REGION: "us-east-1",
    S3_BUCKET: "gusset",
    // s3rver accepts only this key pair.
    S3_ACCESS_KEY_ID: "S3RVER",
    S3_SECRET_ACCESS_KEY: "S3RVER",
    GUSSET_BASE_URL: appUrl,
  };
  if (fakeMail) env.FAKE_MAIL_API_URL = `http://127.0.0.1:${ports.mailApi}`;
  // The test server believes X-Forwarded-For from 127.0.0.2 only, which tests/integration/security.test.ts
  // connects from to play a load balancer; everything else on loopback is an ordinary client.
  if (profile === "test") env.GUSSET_TRUSTED_PROXIES = "127.0.0.2";
  return env;
}

/** Writes .env.local for `next dev`/`next start` run by hand, keeping any lines someone added. */
export function writeEnvLocal(env) {
  const ours = new Set(Object.keys(env));
  const kept = [...readEnvLocal()].filter(([key]) => !ours.has(key) && key !== "FAKE_MAIL_API_URL");
  const lines = [
    "# Written by `npm start` (scripts/start.mjs). BETTER_AUTH_SECRET and GUSSET_LOG_SIGNING_KEY are created once and kept.",
    ...Object.entries(env).map(([key, value]) => `${key}="${value}"`),
    ...kept.map(([key, value]) => `${key}="${value}"`),
  ];
  fs.writeFileSync(envLocalPath, `${lines.join("\n")}\n`, { mode: 0o600 });
}

/**
 * The environment for a child process: ours on top of the inherited one, less the owner's and the
 * superuser's database URLs should the shell have them: those are added only where needed (migrate, vitest).
 */
export function childEnv(gusset, extra = {}) {
  const { DATABASE_OWNER_URL: _owner, DATABASE_ADMIN_URL: _admin, ...inherited } = process.env;
  return { ...inherited, NEXT_TELEMETRY_DISABLED: "1", ...gusset, ...extra };
}
