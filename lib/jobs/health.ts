import "server-only";
// Whether the job queue can take jobs: its schema answers and every queue the app sends to exists
// (the migrations create them; the app never does). Says nothing about the workers.
import { pool } from "@/db";
import type { ServiceState } from "@/lib/data/health";
import { JOB_SCHEMA, QUEUE_NAMES } from "./queues";

export async function checkQueues(): Promise<ServiceState> {
  try {
    const { rows } = await pool.query(`select name from ${JOB_SCHEMA}.queue where name = any($1::text[])`, [QUEUE_NAMES]);
    return rows.length === QUEUE_NAMES.length ? "up" : "down";
  } catch (error) {
    console.warn(`[gusset] job queue check failed: ${error instanceof Error ? error.message : String(error)}`);
    return "down";
  }
}
