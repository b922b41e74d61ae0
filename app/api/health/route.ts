// Liveness for load balancers and the start script. Says nothing about the database or versions:
// it is public, and those details would only help someone probing the deployment.
export const dynamic = "force-dynamic";

export function GET() {
  return Response.json({ ok: true }, { headers: { "Cache-Control": "no-store" } });
}
