// The one database handle. Only the data-access layer (lib/data/**) and the auth library's adapter
// (lib/auth/server.ts) may import it; eslint.config.mjs enforces that.
import { drizzle } from "drizzle-orm/node-postgres";
import { Pool } from "pg";
import * as schema from "./schema";

function createPool(): Pool {
  const connectionString = process.env.DATABASE_URL;
  if (!connectionString) throw new Error("DATABASE_URL is not set (npm start and npm test set it).");
  return new Pool({ connectionString, max: 10 });
}

// Reused across hot reloads in development so connections are not leaked.
const globalForDb = globalThis as unknown as { gussetPool?: Pool };
export const pool = globalForDb.gussetPool ?? createPool();
if (process.env.NODE_ENV !== "production") globalForDb.gussetPool = pool;

export const db = drizzle(pool, { schema, casing: "snake_case" });
export type Database = typeof db;
