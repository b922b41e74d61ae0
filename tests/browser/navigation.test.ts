// The trade's words in the addresses: /jobs and /standards, with the old /projects and /library moved
// there for good (308, query kept); and a click in the navigation shows the section's loading skeleton
// at once, while the server is still answering.
import { afterAll, describe, expect, it } from "vitest";
import type { BrowserContext } from "playwright-core";
import { useBrowser } from "../support/browser";
import { appUrl, testEnv } from "../support/env";
import { demoSession, journeyTimeout, toBrowserCookies } from "../support/pages";

const browser = useBrowser();
const contexts: BrowserContext[] = [];
afterAll(async () => {
  for (const context of contexts) await context.close();
});

describe("old addresses", () => {
  it.each([
    ["/projects", "/jobs"],
    ["/projects?view=all", "/jobs?view=all"],
    ["/library", "/standards"],
    ["/library/some-standard", "/standards/some-standard"],
  ])("%s is permanently moved to %s", async (from, to) => {
    const response = await fetch(appUrl(from), { redirect: "manual" });
    expect(response.status).toBe(308);
    expect(new URL(response.headers.get("location") ?? "", testEnv.baseUrl).toString()).toBe(appUrl(to));
  });

  it(
    "a bookmark to /projects opens the Jobs page, and /library the Standards page",
    async () => {
      const context = await browser().newContext();
      contexts.push(context);
      await context.addCookies(toBrowserCookies(await demoSession("engineer")));
      const page = await context.newPage();
      await page.goto(appUrl("/projects"));
      expect(new URL(page.url()).pathname).toBe("/jobs");
      expect(await page.getByTestId("page-title").textContent()).toBe("Jobs");
      expect(await page.title()).toBe("Jobs · Gusset");
      await page.goto(appUrl("/library"));
      expect(new URL(page.url()).pathname).toBe("/standards");
      expect(await page.getByTestId("page-title").textContent()).toBe("Standards");
    },
    journeyTimeout(1),
  );
});

describe("loading states", () => {
  it(
    "a click in the navigation shows the section's busy skeleton while the server answers slowly",
    async () => {
      const context = await browser().newContext();
      contexts.push(context);
      await context.addCookies(toBrowserCookies(await demoSession("lead")));
      const page = await context.newPage();
      await page.goto(appUrl("/home"), { waitUntil: "load" });
      await page.waitForLoadState("networkidle"); // the links' prefetches (down to each loading.tsx) are in
      // The page itself (not a prefetch) is held back for two seconds, as on a slow day.
      await page.route(
        (url) => url.pathname === "/runs",
        async (route) => {
          const headers = route.request().headers();
          if (headers["rsc"] && !headers["next-router-prefetch"]) await new Promise((resolve) => setTimeout(resolve, 2_000));
          await route.continue();
        },
      );
      const clickedAt = Date.now();
      await page.getByTestId("nav-runs").click();
      const loading = page.getByTestId("page-loading");
      await loading.waitFor({ timeout: 1_500 });
      expect(Date.now() - clickedAt).toBeLessThan(1_500);
      expect(await loading.getAttribute("aria-busy")).toBe("true");
      expect(await loading.getByRole("status").textContent()).toBe("Loading runs…");
      await page.getByTestId("page-title").filter({ hasText: "Runs" }).waitFor();
      expect(await page.getByTestId("page-loading").count()).toBe(0);
    },
    journeyTimeout(1),
  );
});
