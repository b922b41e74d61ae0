// The one database handle. Only the data-access layer (lib/data/**), the job queue (lib/jobs) and the auth
// library's adapter (lib/auth/server.ts) may import it; eslint.config.mjs enforces that.
import { drizzle } from "drizzle-orm/node-postgres";
import { Pool } from "pg";
import { requireSetting } from "@/lib/server-env";
import * as schema from "./schema";

/**
 * How long a request waits for a connection (a new one, or a free one from a busy pool) before it fails
 * as "unavailable": long enough for a real connect, short enough that a page does not hang on a
 * database that is gone.
 */
export const CONNECT_TIMEOUT_MS = 3000;

function createPool(): Pool {
  const created = new Pool({
    connectionString: requireSetting("DATABASE_URL"),
    max: 10,
    connectionTimeoutMillis: CONNECT_TIMEOUT_MS,
  });
  // An idle connection that the server closes (a restart, a failover) is dropped from the pool and
  // reported here; without a listener the 'error' event would end the process. The next query opens a
  // new connection, so the app recovers by itself when the database is back.
  created.on("error", (error) => console.warn(`[gusset] an idle database connection was lost: ${error.message}`));
  return created;
}

// One pool per process: kept on globalThis so hot reloads in development and the separately bundled
// proxy (proxy.ts) share it instead of each opening their own connections.
const globalForDb = globalThis as unknown as { gussetPool?: Pool };
export const pool = (globalForDb.gussetPool ??= createPool());

export const db = drizzle(pool, { schema, casing: "snake_case" });
export type Database = typeof db;
