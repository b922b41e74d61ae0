// The route handlers scripts/serve.mjs answers itself, without Next's router: the same handler functions Next serves
// (imported from app/), bundled by scripts/build-direct-routes.mjs into .next/direct-routes.mjs. Only a hot path
// belongs here: Next's own work for a request (routing, its request and response objects, its streams) costs about
// as much CPU as storing a run does, and POST /api/runs is the write every engineer makes all day.
//
// What Next would add to such an answer, the direct path adds too: the security headers of next.config.ts. A request
// this path cannot answer exactly as Next would (a session better-auth must refresh, which sets a cookie through Next)
// is handed to Next untouched (HandToNext).
import { POST as postRun } from "../app/api/runs/route";
import { answerLiveSessionsOnly, HandToNext } from "../lib/auth/session";
import { DEFAULT_MESSAGES } from "../lib/domain/errors";
import { securityHeaders } from "../lib/domain/security-headers";

type RouteHandler = (request: Request, context: { params: Promise<Record<string, string>> }) => Promise<Response>;

answerLiveSessionsOnly();

/** By "METHOD /path": the exact paths served here (no dynamic segments, so no params). */
export const routes: Readonly<Record<string, RouteHandler>> = { "POST /api/runs": postRun };

/** The headers next.config.ts adds to every answer, as the build fixed them. */
export const answerHeaders: Readonly<Record<string, string>> = securityHeaders({});

/** What a route's unexpected failure answers (the API's "internal" message). */
export const internalMessage = DEFAULT_MESSAGES.internal;

export { HandToNext };
