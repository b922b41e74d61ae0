// The security headers on every response. proxy.ts sets them per request (with a fresh script nonce
// for pages, and HSTS when the app is served over https); next.config.ts sets the same set without a
// nonce on the static files the proxy does not see. The policy allows only what Gusset uses: its own
// scripts, styles, fonts and icon, and requests to itself.

/**
 * The Content-Security-Policy. With a nonce, scripts run only when they carry it (Next stamps it on its
 * own scripts and inline RSC payload) or when such a script loads them ('strict-dynamic': the chunks Next
 * loads while navigating); 'self' is ignored by browsers that know 'strict-dynamic' and kept for those
 * that do not. Without a nonce (static files) only same-origin scripts.
 */
export function contentSecurityPolicy({
  nonce,
  development = false,
  https = false,
}: {
  nonce?: string;
  /** `next dev` only: React rebuilds server error stacks with eval. Never in a build. */
  development?: boolean;
  https?: boolean;
}): string {
  const scripts = nonce ? ["'self'", `'nonce-${nonce}'`, "'strict-dynamic'"] : ["'self'"];
  if (development) scripts.push("'unsafe-eval'");
  const directives: [string, ...string[]][] = [
    ["default-src", "'self'"],
    ["script-src", ...scripts],
    // The run form's live preview: the evaluation bundle (public/evaluation) as a module Worker, from this origin.
    ["worker-src", "'self'"],
    // The stylesheets Next builds (app/globals.css, KaTeX's), served from /_next/static. No inline
    // <style> element is rendered or allowed (Next's route announcer and CodeMirror, mounted in a shadow
    // root, style through the CSSOM, which CSP does not govern).
    ["style-src", "'self'"],
    // Typeset equations: KaTeX sizes its boxes with style="" attributes (height, vertical-align, margins).
    // Attribute styles cannot load anything (img-src and font-src stay 'self') or run script; narratives
    // cannot write attributes at all (their HTML is refused and the output sanitised).
    ["style-src-attr", "'unsafe-inline'"],
    // The app's icon (app/icon.svg); no remote or data: images.
    ["img-src", "'self'"],
    // Inter ships with the app (next/font/local), served from /_next/static/media.
    ["font-src", "'self'"],
    // better-auth's endpoints, server actions and the RSC payloads of client navigation: all same-origin.
    ["connect-src", "'self'"],
    ["object-src", "'none'"],
    ["base-uri", "'self'"],
    // Sign-in and every form post to the app itself.
    ["form-action", "'self'"],
    // No site, not even our own, may frame a page: a framed People page could be clickjacked.
    ["frame-ancestors", "'none'"],
  ];
  if (https) directives.push(["upgrade-insecure-requests"]);
  return directives.map((directive) => directive.join(" ")).join("; ");
}

/** One year; subdomains of the app's own host too. Preloading is left to the operator. */
export const HSTS_VALUE = "max-age=31536000; includeSubDomains";

/** Every header, for a response with this nonce (none for static files). */
export function securityHeaders(options: { nonce?: string; development?: boolean; https?: boolean }): Record<string, string> {
  const headers: Record<string, string> = {
    "Content-Security-Policy": contentSecurityPolicy(options),
    "X-Content-Type-Options": "nosniff",
    "Referrer-Policy": "strict-origin-when-cross-origin",
    // frame-ancestors for browsers that predate CSP level 2.
    "X-Frame-Options": "DENY",
  };
  // Only over https: over http a browser ignores it, and a local http address must stay reachable.
  if (options.https) headers["Strict-Transport-Security"] = HSTS_VALUE;
  return headers;
}
