// axe-core over every page for every role that reaches it (tests/support/app-pages.ts): no serious or
// critical violation. A failure lists each rule with its impact and the elements it found.
import AxeBuilder from "@axe-core/playwright";
import { afterAll, describe, expect, it } from "vitest";
import { useBrowser } from "../support/browser";
import { pageVisits, visitorContexts } from "../support/app-pages";
import { isFakeMailInUse, journeyTimeout } from "../support/pages";

const browser = useBrowser();
const mailboxInUse = await isFakeMailInUse();
// bypassCSP: the page's nonce policy would refuse axe's injected script; the policy has its own test
// (content-security-policy.test.ts), and what axe checks does not depend on it.
const visitors = visitorContexts(browser, { width: 1280, height: 900, bypassCSP: true });

afterAll(async () => {
  await visitors.closeAll();
});

describe("axe finds no serious or critical violation", () => {
  it.each(pageVisits({ mailboxInUse }))(
    "$label",
    async ({ page: { path }, visitor }) => {
      const page = await visitors.open(visitor, path);
      const { violations } = await new AxeBuilder({ page: page as never }).analyze();
      const serious = violations
        .filter((violation) => violation.impact === "serious" || violation.impact === "critical")
        .map((violation) => ({
          rule: violation.id,
          impact: violation.impact,
          help: violation.help,
          targets: violation.nodes.map((node) => node.target.join(" ")),
        }));
      expect(serious).toEqual([]);
      await page.close();
    },
    journeyTimeout(1),
  );

  it("would report one (the check can fail): text at the old grey, 3.4:1 on white", async () => {
    const page = await visitors.open("anonymous", "/sign-in");
    await page.evaluate(() => {
      const p = document.createElement("p");
      p.textContent = "Small grey text that is hard to read";
      p.style.cssText = "color:#838c9c;background:#ffffff;font-size:12px";
      document.querySelector("main")?.append(p);
    });
    const { violations } = await new AxeBuilder({ page: page as never }).withRules(["color-contrast"]).analyze();
    expect(violations.map((violation) => [violation.id, violation.impact])).toEqual([["color-contrast", "serious"]]);
    await page.close();
  });
});
