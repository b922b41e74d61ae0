import "server-only";
// Is this instance able to serve? Read by load balancers and people (GET /api/health) and by the proxy
// before it renders a page (proxy.ts). Neither opens a transaction: they must answer when the database
// cannot, which is when they matter.
import { z } from "zod";
import { checkDatabase, type ServiceState } from "@/lib/data/health";
import { checkQueues } from "@/lib/jobs/health";
import { defineUseCase } from "./use-case";

export type Health = {
  /** ok: serving · degraded: serving, but something it depends on is down · unavailable: cannot serve. */
  status: "ok" | "degraded" | "unavailable";
  checks: { database: ServiceState; queue: ServiceState | "unknown" };
};

/**
 * Public: it names the parts that are down and nothing else (no versions, no addresses, no errors),
 * enough for a person or a load balancer to act on. The queue is read only when the database answers
 * (it lives there), and a missing queue leaves pages working: "degraded", not "unavailable".
 */
export const readHealth = defineUseCase({
  name: "health.read",
  permission: "public",
  input: z.object({}).passthrough(),
  run: async (): Promise<Health> => {
    const database = await checkDatabase();
    if (database === "down") return { status: "unavailable", checks: { database, queue: "unknown" } };
    const queue = await checkQueues();
    return { status: queue === "up" ? "ok" : "degraded", checks: { database, queue } };
  },
  audit: null,
  database: false,
});

/** Whether the database answers: the proxy asks before rendering a page, to answer 503 instead of a broken page. */
export const readDatabaseState = defineUseCase({
  name: "database.check",
  permission: "public",
  input: z.object({}).default({}),
  run: async (): Promise<ServiceState> => checkDatabase(),
  audit: null,
  database: false,
});
