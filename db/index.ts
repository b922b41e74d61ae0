// The one database handle. Only the data-access layer (lib/data/**), the job queue (lib/jobs) and the auth
// library's adapter (lib/auth/server.ts) may import it; eslint.config.mjs enforces that.
import { drizzle } from "drizzle-orm/node-postgres";
import { Pool } from "pg";
import { requireSetting, serverEnv } from "@/lib/server-env";
import * as schema from "./schema";

function createPool(): Pool {
  return new Pool({ connectionString: requireSetting("DATABASE_URL"), max: 10 });
}

// Reused across hot reloads in development so connections are not leaked.
const globalForDb = globalThis as unknown as { gussetPool?: Pool };
export const pool = globalForDb.gussetPool ?? createPool();
if (serverEnv().NODE_ENV !== "production") globalForDb.gussetPool = pool;

export const db = drizzle(pool, { schema, casing: "snake_case" });
export type Database = typeof db;
