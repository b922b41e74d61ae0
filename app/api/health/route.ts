import { routeHandler } from "@/lib/use-cases/next";
import { readHealth } from "@/lib/use-cases/reads";

// Liveness for load balancers and the start script. Says nothing about the database or versions:
// it is public, and those details would only help someone probing the deployment. It still runs as a
// use case like every route handler, so there is no second code path to keep safe.
export const dynamic = "force-dynamic";

export const GET = routeHandler(readHealth, {
  respond: (health) => Response.json(health, { headers: { "Cache-Control": "no-store" } }),
});
