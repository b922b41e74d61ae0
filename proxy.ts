// Runs before every request except the build's static files and the route handlers under /api (both get
// the same headers, without a nonce, from next.config.ts). It does two things:
//
// 1. Security headers (lib/domain/security-headers.ts) on every response, with a fresh script nonce per
//    request. The nonce goes into the Content-Security-Policy of the response and of the request: Next
//    reads it from the request's header while rendering and stamps it on every script it writes, which
//    is why every page renders per request (app/layout.tsx).
// 2. A database outage: before a page is rendered, one `select 1`. A page whose database is gone would
//    fail half-way and answer 500 with Next's bare error page, and once rendering has started its status
//    can no longer change; here it still can. So the request is answered 503 with Retry-After, and marked
//    for next.config.ts to rewrite to the outage page (app/unavailable), which needs no database. The API
//    answers its own 503s (lib/use-cases/next.ts).
//
// Route handlers are left out because they need neither: they answer JSON and files, which run no script, so
// the fixed policy of next.config.ts is theirs; and running the proxy cost a quarter of a signed-in API
// request's CPU (a third of a millisecond and more; `npm run bench:runs`). HSTS, over https, comes with every
// page a browser opens, which is what makes it keep to https for the whole host, its API included.
import { NextResponse, type NextRequest } from "next/server";
import { OUTAGE_REQUEST_HEADER, RETRY_AFTER_SECONDS } from "@/lib/domain/outage";
import { securityHeaders } from "@/lib/domain/security-headers";
import { appBaseUrl, serverEnv } from "@/lib/server-env";
import { readDatabaseState } from "@/lib/use-cases/health";
import { runUseCase } from "@/lib/use-cases/run";

/** 128 random bits, base64: unguessable, and new for every response. */
function createNonce(): string {
  return Buffer.from(crypto.getRandomValues(new Uint8Array(16))).toString("base64");
}

/**
 * A page being read: not the API, not a file (the icon), not a server action (a POST that answers its
 * form with the API's "unavailable" message). Client navigations (RSC requests) count: answered 503,
 * the router falls back to loading the address as a page, which then shows the outage page.
 */
function isPageRead(request: NextRequest): boolean {
  const { pathname } = request.nextUrl;
  if (request.method !== "GET" && request.method !== "HEAD") return false;
  if (request.headers.has("next-action")) return false;
  return !pathname.startsWith("/api/") && !/\.[A-Za-z0-9]+$/.test(pathname);
}

export async function proxy(request: NextRequest): Promise<NextResponse> {
  const nonce = createNonce();
  const headers = securityHeaders({
    nonce,
    development: serverEnv().NODE_ENV === "development",
    https: appBaseUrl().startsWith("https://"),
  });
  const requestHeaders = new Headers(request.headers);
  requestHeaders.set("Content-Security-Policy", headers["Content-Security-Policy"]);
  requestHeaders.delete(OUTAGE_REQUEST_HEADER); // only the proxy may ask for the outage page
  // The page's own address, for the sign-in page's ?next= (lib/auth/session.ts); set here, never the client's.
  requestHeaders.set("x-gusset-path", `${request.nextUrl.pathname}${request.nextUrl.search}`);

  const outage = isPageRead(request) && (await runUseCase(readDatabaseState, { actor: null, input: {} })) === "down";
  // next.config.ts rewrites a request that carries this header to the outage page; the status set here stays.
  if (outage) requestHeaders.set(OUTAGE_REQUEST_HEADER, `${request.nextUrl.pathname}${request.nextUrl.search}`);
  const response = NextResponse.next({ request: { headers: requestHeaders }, ...(outage ? { status: 503 } : {}) });
  if (outage) {
    response.headers.set("Retry-After", String(RETRY_AFTER_SECONDS));
    response.headers.set("Cache-Control", "no-store");
  }
  for (const [name, value] of Object.entries(headers)) response.headers.set(name, value);
  return response;
}

export const config = {
  // Everything but the build's own static files (hashed, immutable) and the route handlers; next.config.ts
  // gives both their headers.
  matcher: ["/((?!_next/static/|_next/image|api/).*)"],
};
