// Runs before every request except the build's static files (those get the same headers, without a
// nonce, from next.config.ts): the security headers (lib/domain/security-headers.ts) on every response,
// with a fresh script nonce per request. The nonce goes into the Content-Security-Policy of the response
// and of the request: Next reads it from the request's header while rendering and stamps it on every
// script it writes, which is why every page renders per request (app/layout.tsx).
import { NextResponse, type NextRequest } from "next/server";
import { securityHeaders } from "@/lib/domain/security-headers";
import { appBaseUrl, serverEnv } from "@/lib/server-env";

/** 128 random bits, base64: unguessable, and new for every response. */
function createNonce(): string {
  return Buffer.from(crypto.getRandomValues(new Uint8Array(16))).toString("base64");
}

export function proxy(request: NextRequest): NextResponse {
  const headers = securityHeaders({
    nonce: createNonce(),
    development: serverEnv().NODE_ENV === "development",
    https: appBaseUrl().startsWith("https://"),
  });
  const requestHeaders = new Headers(request.headers);
  requestHeaders.set("Content-Security-Policy", headers["Content-Security-Policy"]);
  const response = NextResponse.next({ request: { headers: requestHeaders } });
  for (const [name, value] of Object.entries(headers)) response.headers.set(name, value);
  return response;
}

export const config = {
  // Everything but the build's own static files (hashed, immutable; next.config.ts gives them headers).
  matcher: ["/((?!_next/static/|_next/image).*)"],
};
