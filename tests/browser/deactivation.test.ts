// Deactivation ends an open session: a person is signed in in one browser; an admin deactivates them
// in another; the person's next page load lands on sign-in, and signing in again is refused in plain
// words. Reactivation lets them back in. The person is created by invitation in this run.
import type { Browser } from "playwright-core";
import { afterAll, beforeAll, expect, it } from "vitest";
import { pool } from "@/db";
import { launchBrowser } from "../support/browser";
import { appUrl } from "../support/env";
import {
  AppShell,
  PeoplePage,
  SignInPage,
  invitePersonAndAccept,
  journeyTimeout,
  openPeopleAsAdmin,
  uniqueEmail,
} from "../support/pages";

let browser: Browser;

beforeAll(async () => {
  browser = await launchBrowser();
});

afterAll(async () => {
  await browser?.close();
});

it(
  "an admin's deactivation ends the person's open session at their next navigation",
  async () => {
    const person = {
      name: "Ines Halloran-Beck",
      email: uniqueEmail("leaver"),
      role: "engineer" as const,
      password: "leaving-the-firm-soon",
    };
    const { password } = person;

    // The person joins by invitation and is signed in, working on the jobs page.
    const { context: adminContext, people } = await openPeopleAsAdmin(browser);
    const { context: personContext, page } = await invitePersonAndAccept(browser, people, person);
    await page.goto(appUrl("/jobs"));
    await page.getByTestId("jobs-table").waitFor();

    // The admin deactivates them; the audit trail has the address the admin's browser connected from.
    await people.goto();
    await people.deactivate(person.email);
    const { rows } = await pool.query(
      "select ip_address from audit_events where action = 'users.deactivate' and details->>'email' = $1",
      [person.email],
    );
    expect(rows).toEqual([{ ip_address: "127.0.0.1" }]);

    // Their next navigation — client-side, through the menu — lands on sign-in, which says why and whom to ask.
    await page.getByTestId("nav-home").click();
    await page.waitForURL((url) => url.pathname === "/sign-in", { timeout: 15_000 });
    const reason = page.getByTestId("sign-in-reason");
    await reason.waitFor();
    expect(await page.getByRole("heading", { level: 1 }).textContent()).toBe("This account has been deactivated");
    expect(await reason.textContent()).toMatch(
      /administrator of your firm deactivated this account.*ask one of your firm's admins/,
    );
    // A full page load does too, and /api/me no longer knows them.
    await page.goto(appUrl("/jobs"));
    expect(new URL(page.url()).pathname).toBe("/sign-in");
    const me = await page.request.get(appUrl("/api/me"));
    expect(me.status()).toBe(401);

    // Signing in again is refused, saying why.
    const signIn = new SignInPage(page);
    expect(await signIn.attempt(person.email, password)).toBe("error");
    expect(await signIn.formError().textContent()).toMatch(/deactivated/i);

    // Reactivated, they can sign in again.
    await people.reactivate(person.email);
    await signIn.goto();
    await signIn.signIn(person.email, password);
    await new AppShell(page).home().waitFor();

    await personContext.close();
    await adminContext.close();
  },
  journeyTimeout(3),
);

it("a refusal from the server shows on that person's row, in its words", async () => {
  // Two admin tabs: one deactivates the person, the other (not yet refreshed) then tries the same.
  // The server refuses the second (the last-admin rule gives the same kind of refusal; it is tested
  // against the data layer, where the number of admins is under the test's control).
  const person = {
    name: "Ottilie Brandvold",
    email: uniqueEmail("twice"),
    role: "auditor" as const,
    password: "deactivated-twice-over",
  };
  const { context: adminContext, people } = await openPeopleAsAdmin(browser);
  const { context: personContext } = await invitePersonAndAccept(browser, people, person);
  await personContext.close();
  await people.goto();
  const staleTab = new PeoplePage(await adminContext.newPage());
  await staleTab.goto();

  await people.deactivate(person.email);

  const row = staleTab.row(person.email);
  expect(await row.getAttribute("data-status")).toBe("active");
  await row.getByTestId("user-deactivate").click();
  await row.getByTestId("user-deactivate-confirm").click();
  const error = row.getByTestId("user-row-error");
  await error.waitFor();
  expect(await error.textContent()).toMatch(/already deactivated/i);
  await adminContext.close();
});
