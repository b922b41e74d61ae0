import { routeHandler } from "@/lib/use-cases/next";
import { readSelf } from "@/lib/use-cases/reads";

// Who am I: any signed-in role may ask; an anonymous caller gets 401 JSON.
// Flat body (not the { data } envelope): the shape this endpoint promises its callers.
export const GET = routeHandler(readSelf, {
  respond: (self) => Response.json(self, { headers: { "Cache-Control": "no-store" } }),
});
