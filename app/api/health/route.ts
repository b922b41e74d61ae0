import { guardedRoute } from "@/lib/auth/guard";

// Liveness for load balancers and the start script. Says nothing about the database or versions:
// it is public, and those details would only help someone probing the deployment. It still goes
// through the guard like every route handler, so there is no second code path to keep safe.
export const dynamic = "force-dynamic";

export const GET = guardedRoute({ permission: "public" }, async () =>
  Response.json({ ok: true }, { headers: { "Cache-Control": "no-store" } }),
);
