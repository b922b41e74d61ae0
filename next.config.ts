import type { NextConfig } from "next";
import { OUTAGE_PAGE_PATH, OUTAGE_REQUEST_HEADER } from "./lib/domain/outage";
import { securityHeaders } from "./lib/domain/security-headers";

const nextConfig: NextConfig = {
  // The engine and the server talk only over loopback here; keep the build reproducible and quiet.
  poweredByHeader: false,
  serverExternalPackages: ["pg", "playwright-core"],
  typedRoutes: false,
  // forbidden() renders app/forbidden.tsx with a 403 status.
  experimental: { authInterrupts: true },
  // The security headers, without a nonce, on every response: this is what the build's static files
  // (/_next/static) and the route handlers (/api), which proxy.ts skips, get. For pages proxy.ts sets them again per request,
  // replacing these, with the page's nonce and, over https, HSTS (it reads the app's address at run time;
  // these are fixed when the app is built).
  async headers() {
    const headers = Object.entries(securityHeaders({})).map(([key, value]) => ({ key, value }));
    return [{ source: "/:path*", headers }];
  },
  // While the database cannot be reached, proxy.ts marks a page request with this header (and answers
  // 503); this shows the outage page in its place. A rewrite from proxy.ts itself would do the same, but
  // Next proxies such a rewrite over HTTP, back into the proxy, when it was started with -H 127.0.0.1
  // (vercel/next.js#94745); a rewrite here stays inside the server. proxy.ts drops the header from
  // every page request, so only an outage sets it; route handlers (which the proxy does not see, and which answer
  // their own 503s) are never rewritten, whatever a client sends.
  // The trade's words: a project is a job, the firm's calculation templates are its standards. Old
  // addresses (bookmarks, links in e-mails) keep working, permanently moved.
  async redirects() {
    return [
      { source: "/projects", destination: "/jobs", permanent: true },
      { source: "/projects/:path*", destination: "/jobs/:path*", permanent: true },
      { source: "/library", destination: "/standards", permanent: true },
      { source: "/library/:path*", destination: "/standards/:path*", permanent: true },
    ];
  },
  async rewrites() {
    return {
      beforeFiles: [
        { source: "/:path((?!api/).*)", has: [{ type: "header", key: OUTAGE_REQUEST_HEADER }], destination: OUTAGE_PAGE_PATH },
      ],
      afterFiles: [],
      fallback: [],
    };
  },
};

export default nextConfig;
