// Applies the Drizzle migrations in drizzle/ as the owner role (DATABASE_OWNER_URL), then grants the app's
// role (the user in DATABASE_URL) its privileges on everything there is now, new tables included
// (scripts/lib/app-privileges.ts). Run by `npm start`, `npm test` and `npm run db:migrate`.
import fs from "node:fs";
import path from "node:path";
import { drizzle } from "drizzle-orm/node-postgres";
import { migrate } from "drizzle-orm/node-postgres/migrator";
import type pg from "pg";
import { checkAppRole, grantAppPrivileges } from "./lib/app-privileges";
import { runDatabaseScript } from "./lib/database-script";

const migrationsFolder = path.resolve(import.meta.dirname, "..", "drizzle");

async function countApplied(pool: pg.Pool): Promise<number> {
  try {
    const result = await pool.query("select count(*)::int as n from drizzle.__drizzle_migrations");
    return result.rows[0].n as number;
  } catch {
    return 0; // the table appears with the first migration
  }
}

async function withConnection<T>(pool: pg.Pool, work: (client: pg.PoolClient) => Promise<T>): Promise<T> {
  const client = await pool.connect();
  try {
    return await work(client);
  } finally {
    client.release();
  }
}

/** The app's role: the user DATABASE_URL logs in as. Read before migrating, so a missing one changes nothing. */
function appRoleOrThrow(): string {
  const url = process.env.DATABASE_URL;
  if (!url) throw new Error("DATABASE_URL is not set: its user is the app's role, which the migrations grant its privileges to");
  const role = decodeURIComponent(new URL(url).username);
  if (!role) throw new Error("DATABASE_URL names no user: it must log in as the app's own role");
  return role;
}

runDatabaseScript(
  "migrate",
  async (pool, url) => {
    const database = new URL(url).pathname.slice(1);
    const appRole = appRoleOrThrow();
    if (!fs.existsSync(path.join(migrationsFolder, "meta", "_journal.json"))) {
      console.log("migrate: drizzle/ has no migrations yet (no meta/_journal.json): nothing to apply");
      return 0;
    }
    await withConnection(pool, (client) => checkAppRole(client, appRole)); // before migrating: a wrong set-up changes nothing
    const before = await countApplied(pool);
    await migrate(drizzle(pool), { migrationsFolder });
    const after = await countApplied(pool);
    console.log(`migrate: ${after - before} new migration(s) applied to ${database}, ${after} in total`);
    const granted = await withConnection(pool, (client) => grantAppPrivileges(client, appRole));
    const appendOnly = granted.appendOnly.length > 0 ? `; append-only: ${granted.appendOnly.join(", ")}` : "";
    console.log(
      `migrate: privileges of ${appRole} set on ${granted.tables} tables (${granted.jobQueueTables} of the job queue${appendOnly})`,
    );
    return 0;
  },
  { urlVariable: "DATABASE_OWNER_URL" },
);
