// The Content-Security-Policy in a real browser: navigating in the client loads code with no violation;
// markup injected into a page cannot run script (what the policy is for); and a same-site page that
// frames the People page gets nothing (frame-ancestors 'none'). That every page, for everyone who
// reaches it, runs its scripts under the policy with no violation is checked by page-walk.test.ts.
import http from "node:http";
import type { AddressInfo } from "node:net";
import type { BrowserContext, Page } from "playwright-core";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { useBrowser } from "../support/browser";
import { appUrl } from "../support/env";
import { watchViolations } from "../support/csp";
import { demoSession, journeyTimeout, toBrowserCookies, type SessionCookie } from "../support/pages";

const browser = useBrowser();

let admin: SessionCookie;
const contexts: BrowserContext[] = [];

async function newPage(session: SessionCookie | null): Promise<Page> {
  const context = await browser().newContext();
  contexts.push(context);
  if (session) await context.addCookies(toBrowserCookies(session));
  return context.newPage();
}
const adminPage = () => newPage(admin);

beforeAll(async () => {
  admin = await demoSession("admin");
}, journeyTimeout(1));

afterAll(async () => {
  for (const context of contexts) await context.close();
});

describe("client navigation", () => {
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
