// Watches a page for Content-Security-Policy refusals: the securitypolicyviolation events (recorded from
// before the page's first script) and the console's CSP errors.
import type { Page } from "playwright-core";

export type Violation = { directive: string; blocked: string; sample: string };

/** Call before page.goto. */
export async function watchViolations(page: Page): Promise<{ events: () => Promise<Violation[]>; console: string[] }> {
  await page.addInitScript(() => {
    const found: { directive: string; blocked: string; sample: string }[] = [];
    (window as unknown as { __cspViolations: typeof found }).__cspViolations = found;
    document.addEventListener("securitypolicyviolation", (event) =>
      found.push({ directive: event.effectiveDirective, blocked: event.blockedURI, sample: event.sample }),
    );
  });
  const messages: string[] = [];
  page.on("console", (message) => {
    if (/content security policy/i.test(message.text())) messages.push(message.text());
  });
  return {
    events: () => page.evaluate(() => (window as unknown as { __cspViolations?: Violation[] }).__cspViolations ?? []),
    console: messages,
  };
}

/** The policy's script-src with this response's nonce (a page without one would pass the rest trivially). */
export const NONCE_POLICY = /script-src 'self' 'nonce-[A-Za-z0-9+/]{22}==' 'strict-dynamic'/;
