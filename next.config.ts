import type { NextConfig } from "next";
import { securityHeaders } from "./lib/domain/security-headers";

const nextConfig: NextConfig = {
  // The engine and the server talk only over loopback here; keep the build reproducible and quiet.
  poweredByHeader: false,
  serverExternalPackages: ["pg"],
  typedRoutes: false,
  // forbidden() renders app/forbidden.tsx with a 403 status.
  experimental: { authInterrupts: true },
  // The security headers, without a nonce, on every response: this is what the build's static files
  // (/_next/static, which proxy.ts skips) get. For everything else proxy.ts sets them again per request,
  // replacing these, with the page's nonce and, over https, HSTS (it reads the app's address at run time;
  // these are fixed when the app is built).
  async headers() {
    const headers = Object.entries(securityHeaders({})).map(([key, value]) => ({ key, value }));
    return [{ source: "/:path*", headers }];
  },
};

export default nextConfig;
