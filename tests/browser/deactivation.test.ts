// Deactivation ends an open session: a person is signed in in one browser; an admin deactivates them
// in another; the person's next page load lands on sign-in, and signing in again is refused in plain
// words. Reactivation lets them back in. The person is created by invitation in this run.
import type { Browser } from "playwright-core";
import { afterAll, beforeAll, expect, it } from "vitest";
import { launchBrowser } from "../support/browser";
import { appUrl } from "../support/env";
import { AppShell, SignInPage, invitePersonAndAccept, journeyTimeout, openPeopleAsAdmin, uniqueEmail } from "../support/pages";

let browser: Browser;

beforeAll(async () => {
  browser = await launchBrowser();
});

afterAll(async () => {
  await browser?.close();
});

it("an admin's deactivation ends the person's open session at their next navigation", async () => {
  const person = { name: "Ines Halloran-Beck", email: uniqueEmail("leaver"), role: "engineer" as const, password: "leaving-the-firm-soon" };
  const { password } = person;

  // The person joins by invitation and is signed in, working on the projects page.
  const { context: adminContext, people } = await openPeopleAsAdmin(browser);
  const { context: personContext, page } = await invitePersonAndAccept(browser, people, person);
  await page.goto(appUrl("/projects"));
  await page.getByTestId("projects-table").waitFor();

  // The admin deactivates them.
  await people.goto();
  await people.deactivate(person.email);

  // Their next navigation — client-side, through the menu — lands on sign-in.
  await page.getByTestId("nav-home").click();
  await page.waitForURL((url) => url.pathname === "/sign-in", { timeout: 15_000 });
  // A full page load does too, and /api/me no longer knows them.
  await page.goto(appUrl("/projects"));
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
}, journeyTimeout(3));

it("the last active admin cannot be deactivated; the refusal shows on that row", async () => {
  const { context: adminContext, people } = await openPeopleAsAdmin(browser);
  const page = people.page;
  const adminEmail = "admin@marrowby-fenn.example";
  const activeAdmins = await page.locator('[data-testid="user-row"][data-role="admin"][data-status="active"]').count();
  expect(activeAdmins, "these tests never make a second admin").toBe(1);
  const row = people.row(adminEmail);
  await row.getByTestId("user-deactivate").click();
  await row.getByTestId("user-deactivate-confirm").click();
  await row.getByTestId("user-row-error").waitFor();
  expect(await row.getByTestId("user-row-error").textContent()).toMatch(/last active admin/i);
  expect(await row.getAttribute("data-status")).toBe("active");
  await adminContext.close();
});
