// A throwaway database on the test server, for tests that need an empty one (migrations, seed): made
// in beforeAll, dropped in afterAll, with the project's own scripts run against it.
import { spawnSync } from "node:child_process";
import { randomBytes } from "node:crypto";
import path from "node:path";
import pg from "pg";

export const serverUrl = new URL(process.env.DATABASE_URL ?? "postgres://postgres@127.0.0.1:54329/gusset_test");

export async function withClient<T>(url: URL, work: (client: pg.Client) => Promise<T>): Promise<T> {
  const client = new pg.Client({ connectionString: url.toString() });
  await client.connect();
  try {
    return await work(client);
  } finally {
    await client.end();
  }
}

/** `label` goes into the database name, so a left-over database says which test made it. */
export function scratchDatabase(label: string) {
  const name = `gusset_${label}_check_${randomBytes(4).toString("hex")}`;
  const url = new URL(serverUrl);
  url.pathname = `/${name}`;
  const onServer = (sql: string) => withClient(serverUrl, (client) => client.query(sql));
  return {
    url,
    create: () => onServer(`create database "${name}"`),
    drop: () => onServer(`drop database if exists "${name}" with (force)`),
    /** Runs a script through tsx with DATABASE_URL pointing here; `args` go to tsx before the script. */
    runScript: (script: string, args: string[] = []) =>
      spawnSync(path.resolve("node_modules/.bin/tsx"), [...args, script], {
        env: { ...process.env, DATABASE_URL: url.toString() },
        encoding: "utf8",
      }),
  };
}
