// Applies the Drizzle migrations in drizzle/ to DATABASE_URL. Run by `npm start`, `npm test` and `npm run db:migrate`.
import fs from "node:fs";
import path from "node:path";
import { drizzle } from "drizzle-orm/node-postgres";
import { migrate } from "drizzle-orm/node-postgres/migrator";
import type pg from "pg";
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

runDatabaseScript("migrate", async (pool, url) => {
  const database = new URL(url).pathname.slice(1);
  if (!fs.existsSync(path.join(migrationsFolder, "meta", "_journal.json"))) {
    console.log("migrate: drizzle/ has no migrations yet (no meta/_journal.json): nothing to apply");
    return 0;
  }
  const before = await countApplied(pool);
  await migrate(drizzle(pool), { migrationsFolder });
  const after = await countApplied(pool);
  console.log(`migrate: ${after - before} new migration(s) applied to ${database}, ${after} in total`);
  return 0;
});
