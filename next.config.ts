import type { NextConfig } from "next";

const nextConfig: NextConfig = {
  // The engine and the server talk only over loopback here; keep the build reproducible and quiet.
  poweredByHeader: false,
  serverExternalPackages: ["pg"],
  typedRoutes: false,
  // forbidden() renders app/forbidden.tsx with a 403 status.
  experimental: { authInterrupts: true },
};

export default nextConfig;
