// Launches Debian's chromium through playwright-core with the flags that work in these sandboxes.
import { chromium, type Browser, type BrowserContext, type Page } from "playwright-core";
import { afterAll, beforeAll } from "vitest";
import { toBrowserCookies } from "./pages/sessions";

export const CHROMIUM_PATH = process.env.CHROMIUM_PATH ?? "/usr/bin/chromium";

export function launchBrowser(): Promise<Browser> {
  return chromium.launch({
    executablePath: CHROMIUM_PATH,
    headless: true,
    args: [
      "--no-sandbox",
      "--disable-gpu",
      "--disable-quic",
      "--no-first-run",
      "--disable-background-networking",
      "--disable-component-update",
      "--disable-sync",
    ],
  });
}

/**
 * One browser for a test file: launched before its tests, closed after them.
 *   const browser = useBrowser();
 *   it("…", async () => { const page = await browser().newPage(); … });
 */
export function useBrowser(): () => Browser {
  let browser: Browser | undefined;
  beforeAll(async () => {
    browser = await launchBrowser();
  });
  afterAll(async () => {
    await browser?.close();
  });
  return () => {
    if (!browser) throw new Error("useBrowser(): the browser is only there inside tests");
    return browser;
  };
}

/**
 * A page signed in with a session cookie, each in a context of its own (1280 × 900), all closed after the file:
 *   const pageAs = usePagesAs(useBrowser());
 *   const author = await pageAs(await demoSession("lead"));
 */
export function usePagesAs(browser: () => Browser): (cookie: string) => Promise<Page> {
  const contexts: BrowserContext[] = [];
  afterAll(async () => {
    for (const context of contexts) await context.close();
  });
  return async (cookie) => {
    const context = await browser().newContext({ viewport: { width: 1280, height: 900 } });
    contexts.push(context);
    await context.addCookies(toBrowserCookies(cookie));
    return context.newPage();
  };
}
