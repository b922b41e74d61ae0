// Every page for every role that reaches it (tests/support/app-pages.ts), opened once and checked three
// ways: the Content-Security-Policy (the response carries a nonce policy, Next's scripts run under it, and
// nothing is refused — a policy narrower than what the app uses would show here); axe-core finds no
// serious or critical violation at desktop width; and at a phone's width (390 px) the page does not
// scroll sideways. One visit per page keeps the walk affordable as pages are added; each check has a
// case below showing it can fail.
import fs from "node:fs";
import path from "node:path";
import type { Page } from "playwright-core";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { seriousViolations } from "../support/axe";
import { useBrowser } from "../support/browser";
import { APP_PAGES, measureWidth, NOT_PAGES, pageVisits, PHONE, SIGNED_IN, visitorContexts } from "../support/app-pages";
import { NONCE_POLICY, watchViolations } from "../support/csp";
import { demoSession, isFakeMailInUse, journeyTimeout } from "../support/pages";

const browser = useBrowser();
const mailboxInUse = await isFakeMailInUse();
const DESKTOP = { width: 1280, height: 900 };
const visitors = visitorContexts(browser, DESKTOP);

// The visits below run a few at once; the demo sessions are made first, one after another, so that
// concurrent visits do not each sign in (and race to write the sessions' cache).
beforeAll(async () => {
  for (const role of SIGNED_IN) await demoSession(role);
}, journeyTimeout(SIGNED_IN.length));

afterAll(async () => {
  await visitors.closeAll();
});

/** Narrows the window to a phone's; how wide the document is then, and what reaches past its right edge. */
async function measureAtPhoneWidth(page: Page) {
  await page.setViewportSize(PHONE);
  return measureWidth(page);
}

describe("every page, for everyone who reaches it", () => {
  it("has a line in app-pages.ts for every page the build contains", () => {
    const manifest = JSON.parse(
      fs.readFileSync(path.resolve(import.meta.dirname, "..", "..", ".next", "server", "app-paths-manifest.json"), "utf8"),
    ) as Record<string, string>;
    const listed = new Set([...APP_PAGES.map((page) => page.entry), ...NOT_PAGES]);
    const built = Object.keys(manifest).filter((entry) => entry.endsWith("/page"));
    expect(built.length).toBeGreaterThan(10);
    expect(built.filter((entry) => !listed.has(entry))).toEqual([]);
  });

  // The visits only read, each in its own page, so a few run at once (see maxConcurrency in vitest.config.ts):
  // most of a visit is waiting, for the network to go quiet and for the server.
  it.concurrent.for(pageVisits({ mailboxInUse }))(
    "$label: no CSP refusal, nothing serious for axe, nothing sideways at 390 px",
    { timeout: journeyTimeout(1) },
    async ({ page: { path: address, status = 200 }, visitor }, { expect }) => {
      let violations!: Awaited<ReturnType<typeof watchViolations>>;
      const { page, response } = await visitors.visit(visitor, address, async (page) => {
        violations = await watchViolations(page);
      });
      expect(response?.status()).toBe(status);
      expect(response?.headers()["content-security-policy"]).toMatch(NONCE_POLICY);
      expect(await violations.events()).toEqual([]);
      expect(violations.console).toEqual([]);

      expect(await seriousViolations(page)).toEqual([]);

      const { scrollWidth, clientWidth, escaping } = await measureAtPhoneWidth(page);
      expect({ scrollWidth, escaping }).toEqual({ scrollWidth: clientWidth, escaping: [] });
      expect(clientWidth).toBe(PHONE.width);
      await page.close();
    },
  );
});

describe("each check can fail", () => {
  it("axe reports text at the old grey, 3.4:1 on white", async () => {
    const page = await visitors.open("anonymous", "/sign-in");
    await page.evaluate(() => {
      const p = document.createElement("p");
      p.textContent = "Small grey text that is hard to read";
      p.style.cssText = "color:#838c9c;background:#ffffff;font-size:12px";
      document.querySelector("main")?.append(p);
    });
    // The walk's own check, every rule axe runs by default: only the grey text is found.
    const findings = await seriousViolations(page);
    expect(findings.map((finding) => [finding.rule, finding.impact])).toEqual([["color-contrast", "serious"]]);
    expect(findings[0].targets).toHaveLength(1);
    await page.close();
  });

  it("narrowing the window finds a box that is wider than a phone", async () => {
    const page = await visitors.open("anonymous", "/sign-in");
    await page.evaluate(() => {
      const wide = document.createElement("div");
      wide.dataset.testid = "too-wide";
      wide.style.cssText = "width:600px;height:10px";
      document.querySelector("main")?.append(wide);
    });
    const { scrollWidth, escaping } = await measureAtPhoneWidth(page);
    expect(scrollWidth).toBeGreaterThan(PHONE.width);
    expect(escaping.some((element) => element.startsWith("div[too-wide]"))).toBe(true);
    await page.close();
  });

  it("the policy watch sees an inline event handler the policy refuses", async () => {
    let violations!: Awaited<ReturnType<typeof watchViolations>>;
    const { page } = await visitors.visit("anonymous", "/sign-in", async (page) => {
      violations = await watchViolations(page);
    });
    await page.evaluate(() => {
      const image = document.createElement("img");
      image.setAttribute("onerror", "window.__ran = true");
      image.src = "/no-such-image.png";
      document.body.append(image);
    });
    await expect
      .poll(async () => (await violations.events()).map((violation) => violation.directive))
      .toEqual(["script-src-attr"]);
    expect(await page.evaluate(() => (window as unknown as { __ran?: boolean }).__ran ?? false)).toBe(false);
    await page.close();
  });
});
