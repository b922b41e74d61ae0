// The Content-Security-Policy in a real browser: every page the build contains, opened by a signed-in
// admin, runs its scripts and draws itself without a single violation (a policy narrower than what the
// app uses would show here); markup injected into a page cannot run script (what the policy is for);
// and a same-site page that frames the People page gets nothing (frame-ancestors 'none').
import fs from "node:fs";
import http from "node:http";
import type { AddressInfo } from "node:net";
import path from "node:path";
import type { BrowserContext, Page } from "playwright-core";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { useBrowser } from "../support/browser";
import { appUrl } from "../support/env";
import { demoSession, isFakeMailInUse, journeyTimeout, toBrowserCookies, type SessionCookie } from "../support/pages";

const browser = useBrowser();

/**
 * Keyed by the build's app-paths-manifest entry: a concrete address for every page and the status an
 * admin gets there (standards, jobs and runs are not an admin's: their 403 page is what is checked).
 */
const PAGES: Record<string, { path: string; status: number | "mailbox" }> = {
  "/page": { path: "/", status: 200 }, // sent home
  "/(auth)/sign-in/page": { path: "/sign-in", status: 200 }, // sent home: already signed in
  "/(auth)/forgot-password/page": { path: "/forgot-password", status: 200 },
  "/(auth)/reset-password/page": { path: "/reset-password?token=not-a-real-token", status: 200 },
  "/(auth)/invite/[token]/page": { path: "/invite/not-a-real-token", status: 200 },
  "/(app)/home/page": { path: "/home", status: 200 },
  "/(app)/profile/page": { path: "/profile", status: 200 },
  "/(app)/standards/page": { path: "/standards", status: 403 },
  "/(app)/jobs/page": { path: "/jobs", status: 403 },
  "/(app)/runs/page": { path: "/runs", status: 403 },
  "/(app)/audit/page": { path: "/audit", status: 200 },
  "/(app)/admin/users/page": { path: "/admin/users", status: 200 },
  "/(app)/admin/mailbox/page": { path: "/admin/mailbox", status: "mailbox" }, // 404 when a real SMTP server is used
  "/_not-found/page": { path: "/no-such-page-here", status: 404 },
  "/unavailable/page": { path: "/unavailable", status: 404 }, // only shown while the database is down
};
/** Framework entries with no address of their own. */
const NOT_PAGES = new Set(["/_global-error/page"]);

const manifest = JSON.parse(
  fs.readFileSync(path.resolve(import.meta.dirname, "..", "..", ".next", "server", "app-paths-manifest.json"), "utf8"),
) as Record<string, string>;
const builtPages = Object.keys(manifest).filter((entry) => entry.endsWith("/page"));

type Violation = { directive: string; blocked: string; sample: string };

/** Collects the page's CSP violation events (from before its first script) and the console's CSP errors. */
async function watchViolations(page: Page): Promise<{ events: () => Promise<Violation[]>; console: string[] }> {
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

let admin: SessionCookie;
let mailboxInUse: boolean;
const contexts: BrowserContext[] = [];

async function newPage(session: SessionCookie | null): Promise<Page> {
  const context = await browser().newContext();
  contexts.push(context);
  if (session) await context.addCookies(toBrowserCookies(session));
  return context.newPage();
}
const adminPage = () => newPage(admin);

/** Opens the address; checks the status, the policy, that Next's scripts ran, and that nothing was refused. */
async function expectCleanVisit(page: Page, address: string, status: number): Promise<void> {
  const violations = await watchViolations(page);
  const response = await page.goto(appUrl(address), { waitUntil: "load" });
  expect(response?.status()).toBe(status);
  // The policy is there (a page without one would pass the rest trivially), with this response's nonce.
  expect(response?.headers()["content-security-policy"]).toMatch(
    /script-src 'self' 'nonce-[A-Za-z0-9+/]{22}==' 'strict-dynamic'/,
  );
  // Next's bootstrap script ran (it is blocked when its nonce is wrong) and React took over the page.
  await page.waitForFunction(() => (window as unknown as { next?: { appDir?: boolean } }).next?.appDir === true);
  await page.waitForLoadState("networkidle");
  expect(await violations.events()).toEqual([]);
  expect(violations.console).toEqual([]);
}

beforeAll(async () => {
  admin = await demoSession("admin");
  mailboxInUse = await isFakeMailInUse();
}, journeyTimeout(1));

afterAll(async () => {
  for (const context of contexts) await context.close();
});

describe("every page for a signed-in admin", () => {
  it("has an address in this test for every page the build contains", () => {
    const listed = new Set([...Object.keys(PAGES), ...NOT_PAGES]);
    expect(builtPages.filter((entry) => !listed.has(entry))).toEqual([]);
  });

  for (const { path: address, status } of Object.values(PAGES)) {
    it(`${address} runs its scripts with no CSP violation`, async () => {
      await expectCleanVisit(await adminPage(), address, status === "mailbox" ? (mailboxInUse ? 200 : 404) : status);
    });
  }

  it("navigates in the client (chunks loaded by trusted scripts) with no CSP violation", async () => {
    const page = await adminPage();
    const violations = await watchViolations(page);
    const response = await page.goto(appUrl("/home"), { waitUntil: "load" });
    expect(response?.headers()["content-security-policy"]).toMatch(/'strict-dynamic'/);
    await page.evaluate(() => ((window as unknown as { __samePage: boolean }).__samePage = true));
    await page.getByTestId("nav-admin-users").click();
    await page.waitForURL((url) => url.pathname === "/admin/users");
    await page.getByTestId("users-table").waitFor();
    // Still the same document: the router fetched the page and its code, the browser did not reload.
    expect(await page.evaluate(() => (window as unknown as { __samePage?: boolean }).__samePage)).toBe(true);
    await page.waitForLoadState("networkidle");
    expect(await violations.events()).toEqual([]);
    expect(violations.console).toEqual([]);
  });
});

describe("the pages a visitor who is not signed in sees", () => {
  it.each([
    ["/sign-in", 200],
    ["/home", 200], // sent to sign in
    ["/forgot-password", 200],
    ["/reset-password?token=not-a-real-token", 200],
    ["/invite/not-a-real-token", 200],
    ["/no-such-page-here", 404],
  ])("%s runs its scripts with no CSP violation", async (address, status) => {
    await expectCleanVisit(await newPage(null), address, status);
  });
});

describe("injected markup", () => {
  it("cannot run script on the People page: an inline script and an inline handler are refused", async () => {
    const page = await adminPage();
    const violations = await watchViolations(page);
    // What a stored cross-site scripting hole would put into the page the server sends (its headers kept).
    await page.route(appUrl("/admin/users"), async (route) => {
      const response = await route.fetch();
      const injected =
        '<script>window.__injectedScript = true</script><img src="/no-such-image.png" onerror="window.__injectedHandler = true">';
      await route.fulfill({ response, body: (await response.text()).replace("</body>", `${injected}</body>`) });
    });
    await page.goto(appUrl("/admin/users"), { waitUntil: "load" });
    await page.getByTestId("users-table").waitFor();
    await page.waitForLoadState("networkidle");
    const ran = await page.evaluate(() => {
      const w = window as unknown as { __injectedScript?: boolean; __injectedHandler?: boolean };
      return { script: w.__injectedScript ?? false, handler: w.__injectedHandler ?? false };
    });
    expect(ran).toEqual({ script: false, handler: false });
    const directives = (await violations.events()).map((violation) => violation.directive).sort();
    expect(directives).toEqual(["script-src-attr", "script-src-elem"]);
    // The page's own scripts still ran.
    expect(await page.evaluate(() => (window as unknown as { next?: { appDir?: boolean } }).next?.appDir)).toBe(true);
  });
});

describe("framing", () => {
  let framer: http.Server;
  let framerOrigin: string;

  beforeAll(async () => {
    // A page on another port of the same host: a different origin, but the same site, so the browser
    // sends the admin's SameSite=Lax session cookie with the framed request.
    framer = http.createServer((request, response) => {
      response.setHeader("Content-Type", "text/html; charset=utf-8");
      if (request.url === "/control") {
        response.end('<!doctype html><p id="control">framed control page</p>');
        return;
      }
      response.end(
        `<!doctype html><title>framer</title>
        <iframe id="app" src="${appUrl("/admin/users")}" width="800" height="600"></iframe>
        <iframe id="control" src="/control"></iframe>`,
      );
    });
    await new Promise<void>((resolve) => framer.listen(0, "127.0.0.1", resolve));
    framerOrigin = `http://127.0.0.1:${(framer.address() as AddressInfo).port}`;
  });

  afterAll(async () => {
    await new Promise((resolve) => framer?.close(resolve));
  });

  it("a same-site page that frames the signed-in People page gets nothing", async () => {
    const page = await adminPage();
    const refusals: string[] = [];
    page.on("console", (message) => {
      if (/frame-ancestors/.test(message.text())) refusals.push(message.text());
    });
    const appResponse = page.waitForResponse((response) => response.url() === appUrl("/admin/users"));
    await page.goto(framerOrigin, { waitUntil: "load" });
    // The request was made, with the session: the server answered the People page itself…
    expect((await appResponse).status()).toBe(200);
    // …and the browser refused to show it in the frame.
    const control = page.frameLocator("#control");
    expect(await control.locator("#control").textContent()).toBe("framed control page"); // frames do work here
    const appFrame = page.frames().find((frame) => frame !== page.mainFrame() && !frame.url().endsWith("/control"));
    expect(appFrame).toBeDefined();
    expect(appFrame!.url()).not.toBe(appUrl("/admin/users"));
    expect(await page.frameLocator("#app").locator("[data-testid=users-table]").count()).toBe(0);
    expect(
      await page
        .frameLocator("#app")
        .locator("body")
        .innerText({ timeout: 2000 })
        .catch(() => ""),
    ).not.toMatch(/People/);
    expect(refusals.join("\n")).toMatch(/frame-ancestors 'none'/);
  });
});
