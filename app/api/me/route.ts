import { guardedRoute } from "@/lib/auth/guard";

// Who am I: any signed-in role may ask; an anonymous caller gets 401 JSON from the guard.
export const GET = guardedRoute({ permission: "signed-in" }, async (_input, { actor }) => {
  const { id, name, email, role } = actor!;
  // Flat body (not the guard's { data } envelope): the shape this endpoint promises its callers.
  return Response.json({ id, name, email, role }, { headers: { "Cache-Control": "no-store" } });
});
