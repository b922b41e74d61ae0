// The environment `npm test` gives vitest (scripts/test.mjs, scripts/lib/env.mjs). The defaults match the
// test profile, so `npx vitest` also works while the test services run.
function read(name: string, fallback: string): string {
  const value = process.env[name];
  return value && value.length > 0 ? value : fallback;
}

export const testEnv = {
  /** The app's role, as the server and the worker connect. */
  databaseUrl: read("DATABASE_URL", "postgres://gusset_app@127.0.0.1:54329/gusset_test"),
  /** The owner role, which runs the migrations: for checks of what the owner sees. */
  ownerDatabaseUrl: read("DATABASE_OWNER_URL", "postgres://gusset_owner@127.0.0.1:54329/gusset_test"),
  /** The superuser, on the maintenance database: only to create and drop scratch databases. */
  adminDatabaseUrl: read("DATABASE_ADMIN_URL", "postgres://postgres@127.0.0.1:54329/postgres"),
  baseUrl: read("GUSSET_BASE_URL", "http://127.0.0.1:3100"),
  mailApiUrl: read("FAKE_MAIL_API_URL", "http://127.0.0.1:2581"),
  /** The QA witness the sealer e-mails each new tree head to. */
  witnessEmail: read("GUSSET_WITNESS_EMAIL", "qa-witness@marrowby-fenn.example"),
  mailFrom: read("MAIL_FROM", "Gusset <no-reply@gusset.example>"),
  smtp: {
    host: read("SMTP_HOST", "127.0.0.1"),
    port: Number(read("SMTP_PORT", "2526")),
  },
  s3: {
    endpoint: read("S3_ENDPOINT", "http://127.0.0.1:4570"),
    region: read("S3_REGION", "us-east-1"),
    bucket: read("S3_BUCKET", "gusset"),
    accessKeyId: read("S3_ACCESS_KEY_ID", "S3RVER"),
    secretAccessKey: read("S3_SECRET_ACCESS_KEY", "S3RVER"),
  },
} as const;

/** A URL on the served test app, e.g. appUrl("/sign-in"). */
export function appUrl(pathname: string): string {
  return new URL(pathname, testEnv.baseUrl).toString();
}
