import { RETRY_AFTER_SECONDS } from "@/lib/domain/outage";
import { routeHandler } from "@/lib/use-cases/next";
import { readHealth } from "@/lib/use-cases/health";
import { jsonResponse } from "@/lib/domain/json-response";

// Health for load balancers, the start script and people: 200 while this instance can serve, 503 while
// it cannot reach its database (so a load balancer takes it out until it can), with the state of each
// check in the body. Public, so it names what is down and nothing more (no versions, addresses or errors).
// It runs as a use case like every route handler, so there is no second code path to keep safe.
export const dynamic = "force-dynamic";

export const GET = routeHandler(readHealth, {
  respond: (health) =>
    jsonResponse(health, {
      status: health.status === "unavailable" ? 503 : 200,
      headers: {
        "Cache-Control": "no-store",
        ...(health.status === "unavailable" ? { "Retry-After": String(RETRY_AFTER_SECONDS) } : {}),
      },
    }),
});
