import "server-only";
// Whether the database answers, for /api/health and for the proxy's check before a page is rendered.
// It uses the app's own pool, so "up" means what a request would get: a connection within the pool's
// connect timeout and an answer to a query.
import type { QueryConfig } from "pg";
import { pool } from "@/db";

export type ServiceState = "up" | "down";

/** A server that accepts the connection but does not answer is down too. */
const PROBE_QUERY_TIMEOUT_MS = 2000;

export async function checkDatabase(): Promise<ServiceState> {
  try {
    // query_timeout per query is node-postgres's own option; its types list it only for the client.
    await pool.query({ text: "select 1", query_timeout: PROBE_QUERY_TIMEOUT_MS } as QueryConfig);
    return "up";
  } catch (error) {
    console.warn(`[gusset] database check failed: ${error instanceof Error ? error.message : String(error)}`);
    return "down";
  }
}
