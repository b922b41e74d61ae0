import { guardedRoute } from "@/lib/auth/guard";
import { AppError } from "@/lib/errors";

// Who am I: any signed-in role may ask; an anonymous caller gets 401 JSON. The guard has no
// "any signed-in person" permission, so it runs as "public" and the handler refuses anonymity itself.
export const GET = guardedRoute({ permission: "public" }, async (_input, { actor }) => {
  if (!actor) throw new AppError("unauthenticated");
  const { id, name, email, role } = actor;
  // Flat body (not the guard's { data } envelope): the shape this endpoint promises its callers.
  return Response.json({ id, name, email, role }, { headers: { "Cache-Control": "no-store" } });
});
