// A person's own time zone, chosen on the profile page, is the one the audit trail and the home cards show
// times in — whatever zone the browser is in. Pacific/Auckland (UTC+12 or +13) differs from UTC at every instant.
import { expect, it } from "vitest";
import { formatInTimeZone, formatUtc } from "@/lib/domain/zoned-time";
import { useBrowser } from "../support/browser";
import { appUrl } from "../support/env";
import { invitePersonAndAccept, journeyTimeout, openPeopleAsAdmin, uniqueEmail } from "../support/pages";

const browser = useBrowser();

it(
  "shows audit times in the zone set on the profile, not the browser's",
  async () => {
    const person = {
      name: "Ravi Thorsdottir",
      email: uniqueEmail("zone"),
      role: "auditor" as const,
      password: "a-zone-of-my-own-2291",
    };
    const { context: adminContext, people } = await openPeopleAsAdmin(browser());
    const { context, page } = await invitePersonAndAccept(browser(), people, person);
    await adminContext.close();

    await page.goto(appUrl("/profile"));
    // The hint naming the browser's zone is rendered only once the form has hydrated.
    await page.getByText("Your browser is set to").waitFor();
    await page.getByTestId("time-zone").selectOption("Pacific/Auckland");
    await page.getByTestId("time-zone-submit").click();
    // The notice names the zone that was stored (a choice lost to hydration would store none).
    expect(await page.getByTestId("time-zone-saved").textContent()).toContain("Pacific/Auckland");

    for (const [path, scope] of [
      ["/audit", "audit-row"],
      ["/home", "home-audit-event"],
    ] as const) {
      await page.goto(appUrl(path));
      const time = page.getByTestId(scope).first().locator("time");
      const instant = new Date((await time.getAttribute("datetime"))!);
      const expected = formatInTimeZone(instant, "Pacific/Auckland");
      expect(expected).not.toBe(formatUtc(instant));
      await expect.poll(async () => (await time.textContent())?.trim(), { timeout: 10_000 }).toBe(expected);
      expect(await time.getAttribute("title")).toBe(formatUtc(instant));
    }
    await context.close();
  },
  journeyTimeout(1),
);
