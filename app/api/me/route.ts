import { getSessionEndReason } from "@/lib/auth/session";
import { routeHandler } from "@/lib/use-cases/next";
import { readSelf } from "@/lib/use-cases/reads";
import { jsonResponse } from "@/lib/domain/json-response";

// Who am I: any signed-in role may ask; an anonymous caller gets 401 JSON.
// Flat body (not the { data } envelope): the shape this endpoint promises its callers.
const readSelfHandler = routeHandler(readSelf, {
  respond: (self) => jsonResponse(self, { headers: { "Cache-Control": "no-store" } }),
});

// A 401 also says why, when the browser's session was ended on purpose (deactivation, a password changed
// elsewhere): looking the session up clears its cookie, so the page the browser asks for next could no
// longer tell. The shell's session watcher takes the reason to the sign-in page (one of a fixed list).
export async function GET(request: Request, context: { params: Promise<Record<string, string>> }): Promise<Response> {
  const response = await readSelfHandler(request, context);
  if (response.status !== 401) return response;
  // Only for a 401, and never at the cost of the answer itself (a database outage is the handler's 503).
  const reason = await getSessionEndReason(request.headers).catch(() => null);
  if (!reason) return response;
  const body = (await response.json()) as Record<string, unknown>;
  return jsonResponse({ ...body, reason }, { status: 401, headers: response.headers });
}
