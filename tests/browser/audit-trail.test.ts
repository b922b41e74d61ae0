// The audit trail a person can read (issue 9, item 1), as the demo admin uses it: change someone's role,
// then find that change on the trail's first page in words — names, "from … to …" — with its time to the
// second in the browser's own zone and UTC on hover; filter by action and by person through the form
// (which also works without JavaScript); and read the same sentence on the home card.
import crypto from "node:crypto";
import type { Browser, Page } from "playwright-core";
import { afterAll, beforeAll, expect, it } from "vitest";
import { db, pool } from "@/db";
import * as schema from "@/db/schema";
import { launchBrowser } from "../support/browser";
import { appUrl } from "../support/env";
import { DEMO_BY_ROLE, PeoplePage, SignInPage, journeyTimeout, uniqueEmail } from "../support/pages";

let browser: Browser;

beforeAll(async () => {
  browser = await launchBrowser();
});

afterAll(async () => {
  await browser?.close();
});

// A zone far from UTC and without daylight saving time, so the expected wall clock is UTC + 9 h all year
// (common practice); the server renders UTC, so only the browser's own formatting can show this.
const BROWSER_ZONE = "Asia/Tokyo";
const ZONE_OFFSET_MS = 9 * 60 * 60 * 1000;

const rows = (page: Page) => page.getByTestId("audit-row");

/** Submits the filter form and waits for the page it leads to. */
async function submitFilters(page: Page): Promise<URL> {
  await Promise.all([
    page.waitForURL((url) => url.pathname === "/audit" && url.search !== ""),
    page.getByTestId("audit-filter-submit").click(),
  ]);
  await page.getByTestId("audit-filters").waitFor();
  return new URL(page.url());
}

it(
  "shows a role change in words on the first page, filters by action and person, and words the home card the same",
  async () => {
    const admin = DEMO_BY_ROLE.admin;
    // The person whose role changes: on record, never signed in (only their row matters here).
    const sam = { id: crypto.randomBytes(16).toString("hex"), name: "Sam Reed", email: uniqueEmail("sam-reed") };
    await db.insert(schema.user).values({ ...sam, role: "engineer", emailVerified: true });

    const context = await browser.newContext({ timezoneId: BROWSER_ZONE, viewport: { width: 1440, height: 900 } });
    const page = await context.newPage();
    const signIn = new SignInPage(page);
    await signIn.goto();
    await signIn.signIn(admin.email, admin.password);

    const people = new PeoplePage(page);
    await people.goto();
    await people.setRole(sam.email, "lead");
    const {
      rows: [recorded],
    } = await pool.query<{ id: string; occurred_at: Date }>(
      "select id, occurred_at from audit_events where action = 'users.set-role' and subject = $1",
      [`user:${sam.id}`],
    );
    expect(recorded).toBeDefined();

    // The trail's first row is that change (the admin's sign-in, newer, is hidden by default), in words.
    // React reports a hydration mismatch (the server wrote UTC, the browser its own zone) as a console error.
    const consoleErrors: string[] = [];
    page.on("console", (message) => {
      if (message.type() === "error") consoleErrors.push(message.text());
    });
    await page.goto(appUrl("/audit"));
    const first = rows(page).first();
    await first.waitFor();
    const sentence = `${admin.name} changed ${sam.name}'s role from Engineer to Standards lead`;
    expect(await first.getAttribute("data-action")).toBe("users.set-role");
    expect((await first.getByTestId("audit-sentence").textContent())?.trim()).toBe(sentence);
    expect(await first.getByTestId("audit-actor").innerText()).toBe(`${admin.name}\n${admin.email}`);
    expect(await first.getByTestId("audit-subject").innerText()).toBe(`${sam.name}\n${sam.email}`);
    expect(await first.innerText()).not.toContain(sam.id);
    expect(await page.getByTestId("audit-sign-ins-hidden").isVisible()).toBe(true);
    expect(
      await rows(page).evaluateAll((all) => all.filter((row) => row.getAttribute("data-action") === "auth.sign-in").length),
    ).toBe(0);

    // Its time: to the second, in the browser's zone (UTC + 9 h), with the UTC time in the title.
    const time = first.locator("time");
    const occurredAt = recorded.occurred_at;
    expect(await time.getAttribute("datetime")).toBe(occurredAt.toISOString());
    const utc = occurredAt.toISOString();
    expect(await time.getAttribute("title")).toBe(`${utc.slice(0, 10)} ${utc.slice(11, 19)} UTC`);
    const local = new Date(occurredAt.getTime() + ZONE_OFFSET_MS).toISOString();
    // The server wrote UTC; the browser rewrites it once hydrated.
    await expect
      .poll(() => time.textContent())
      .toMatch(new RegExp(`^${local.slice(0, 10)} ${local.slice(11, 19)} (GMT\\+9|JST)$`));

    expect(consoleErrors).toEqual([]);
    // The form reads its days in the browser's zone, and says so.
    expect(await page.getByTestId("audit-filter-tz").inputValue()).toBe(BROWSER_ZONE);
    expect(await page.getByTestId("audit-filter-zone").textContent()).toContain(BROWSER_ZONE);

    // Filter by day: the change's own day in Tokyo keeps it; the day after has nothing of ours.
    const localDay = local.slice(0, 10);
    await page.getByLabel("From", { exact: true }).fill(localDay);
    await page.getByLabel("To", { exact: true }).fill(localDay);
    let url = await submitFilters(page);
    expect(Object.fromEntries(url.searchParams)).toMatchObject({ from: localDay, to: localDay, tz: BROWSER_ZONE });
    expect((await rows(page).first().getByTestId("audit-sentence").textContent())?.trim()).toBe(sentence);
    const dayAfter = new Date(Date.parse(`${localDay}T00:00:00Z`) + 24 * 60 * 60 * 1000).toISOString().slice(0, 10);
    await page.getByLabel("From", { exact: true }).fill(dayAfter);
    await page.getByLabel("To", { exact: true }).fill(dayAfter);
    await submitFilters(page);
    expect(await rows(page).count()).toBe(0);
    expect(await page.getByTestId("empty-state").textContent()).toContain("No events match these filters");
    await page.goto(appUrl("/audit"));

    // Filter by action: the URL carries it, every row is a role change, ours among them.
    await page.getByLabel("What", { exact: true }).selectOption({ label: "Changed a role" });
    url = await submitFilters(page);
    expect(url.searchParams.get("action")).toBe("users.set-role");
    expect(new Set(await rows(page).evaluateAll((all) => all.map((row) => row.getAttribute("data-action"))))).toEqual(
      new Set(["users.set-role"]),
    );
    expect((await rows(page).first().getByTestId("audit-sentence").textContent())?.trim()).toBe(sentence);

    // And by person: the demo admin, with the action kept; every row is theirs.
    const { rows: adminRows } = await pool.query<{ id: string }>('select id from "user" where email = $1', [admin.email]);
    await page.getByLabel("Who", { exact: true }).selectOption(adminRows[0].id);
    url = await submitFilters(page);
    expect(Object.fromEntries(url.searchParams)).toMatchObject({ actor: adminRows[0].id, action: "users.set-role" });
    const actors = await page.getByTestId("audit-actor").allInnerTexts();
    expect(actors.length).toBeGreaterThan(0);
    expect(new Set(actors)).toEqual(new Set([`${admin.name}\n${admin.email}`]));
    expect(await page.getByLabel("What", { exact: true }).inputValue()).toBe("users.set-role");

    // Sign-ins only when asked for: the admin's own sign-in of a moment ago.
    await page.getByLabel("What", { exact: true }).selectOption("");
    await page.getByLabel("Show sign-ins").check();
    url = await submitFilters(page);
    expect(url.searchParams.get("signIns")).toBe("1");
    const signInRow = page.locator('[data-testid="audit-row"][data-action="auth.sign-in"]').first();
    expect((await signInRow.getByTestId("audit-sentence").textContent())?.trim()).toBe(`${admin.name} signed in`);

    // A filter the form could not have sent is a message on the page, not an error page.
    const response = await page.goto(appUrl("/audit?from=2026-02-30&action=users.explode"));
    expect(response?.status()).toBe(200);
    const problem = page.getByTestId("audit-filter-error");
    expect(await problem.innerText()).toContain("That date does not exist.");
    expect(await problem.innerText()).toContain("Choose an action from the list.");

    // The home card words the same event the same way, newest first.
    await page.goto(appUrl("/home"));
    const card = page.getByTestId("home-audit");
    expect((await card.getByTestId("audit-sentence").first().textContent())?.trim()).toBe(sentence);
    expect(await card.locator("time").first().getAttribute("title")).toBe(`${utc.slice(0, 10)} ${utc.slice(11, 19)} UTC`);

    await context.close();
  },
  journeyTimeout(1),
);
