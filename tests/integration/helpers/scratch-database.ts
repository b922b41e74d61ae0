// A throwaway database on the test server, for tests that need an empty one (migrations, seed): made
// in beforeAll, dropped in afterAll, with the project's own scripts run against it. It belongs to the
// owner role like the test database; the superuser only creates and drops it.
import { spawnSync } from "node:child_process";
import { randomBytes } from "node:crypto";
import path from "node:path";
import pg from "pg";
import { testEnv } from "../../support/env";

/** The test database as the app's role connects to it. */
export const serverUrl = new URL(testEnv.databaseUrl);
/** The test database as the owner role connects to it. */
export const ownerServerUrl = new URL(testEnv.ownerDatabaseUrl);
const adminUrl = new URL(testEnv.adminDatabaseUrl);
export const appRole = decodeURIComponent(serverUrl.username);
export const ownerRole = decodeURIComponent(ownerServerUrl.username);

export async function withClient<T>(url: URL, work: (client: pg.Client) => Promise<T>): Promise<T> {
  const client = new pg.Client({ connectionString: url.toString() });
  await client.connect();
  try {
    return await work(client);
  } finally {
    await client.end();
  }
}

function onDatabase(base: URL, name: string): URL {
  const url = new URL(base);
  url.pathname = `/${name}`;
  return url;
}

/** `label` goes into the database name, so a left-over database says which test made it. */
export function scratchDatabase(label: string) {
  const name = `gusset_${label}_check_${randomBytes(4).toString("hex")}`;
  const url = onDatabase(serverUrl, name);
  const ownerUrl = onDatabase(ownerServerUrl, name);
  const asAdmin = (sql: string) => withClient(adminUrl, (client) => client.query(sql));
  return {
    /** As the app's role. */
    url,
    /** As the owner role. */
    ownerUrl,
    create: () => asAdmin(`create database "${name}" owner "${ownerRole}"`),
    drop: () => asAdmin(`drop database if exists "${name}" with (force)`),
    /**
     * Runs a script through tsx against this database (both URLs); `args` go to tsx before the script,
     * `env` overrides variables.
     */
    runScript: (script: string, args: string[] = [], env: Record<string, string> = {}) =>
      spawnSync(path.resolve("node_modules/.bin/tsx"), [...args, script], {
        env: { ...process.env, DATABASE_URL: url.toString(), DATABASE_OWNER_URL: ownerUrl.toString(), ...env },
        encoding: "utf8",
      }),
  };
}
