// Each demo role signs in through the page, lands on its own home, sees exactly the navigation its
// role allows, and signs out. The expected menus are written out by hand (not derived from
// ROLE_PERMISSIONS) so that a change to the permissions table shows up here as a deliberate edit.
import type { Browser } from "playwright-core";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { ROLE_LABELS, type Role } from "@/lib/domain/roles";
import { launchBrowser } from "../support/browser";
import { testEnv } from "../support/env";
import { AppShell, DEMO_BY_ROLE, SignInPage, isFakeMailInUse, journeyTimeout } from "../support/pages";

// The admin's demo mailbox is in the menu only while the app runs with the fake SMTP server.
const mailboxInUse = await isFakeMailInUse();

const EXPECTED_NAV: Record<Role, string[]> = {
  admin: ["Home", "Libraries", "Audit trail", "Integrity", "People", ...(mailboxInUse ? ["Demo mailbox"] : [])],
  lead: ["Home", "Standards", "Libraries", "Jobs", "Runs", "Withdrawals"],
  engineer: ["Home", "Standards", "Libraries", "Jobs", "Runs", "Withdrawals"],
  auditor: ["Home", "Standards", "Libraries", "Jobs", "Runs", "Withdrawals", "Audit trail", "Integrity", "People"],
};

// What each home shows first: one panel that only that role's home has.
const HOME_PANEL: Record<Role, string> = {
  admin: "home-invitations",
  lead: "home-library",
  engineer: "home-jobs",
  auditor: "home-integrity",
};

let browser: Browser;

beforeAll(async () => {
  browser = await launchBrowser();
});

afterAll(async () => {
  await browser?.close();
});

describe("signing in as each role", () => {
  for (const role of ["admin", "lead", "engineer", "auditor"] as const) {
    it(
      `${role}: home, navigation, name and role, sign-out`,
      async () => {
        const context = await browser.newContext();
        const page = await context.newPage();
        const { email, password, name } = DEMO_BY_ROLE[role];

        const signIn = new SignInPage(page);
        await signIn.goto();
        await signIn.signIn(email, password);
        expect(new URL(page.url()).pathname).toBe("/home");

        const shell = new AppShell(page);
        await shell.home().waitFor();
        expect(await shell.home().getAttribute("data-role")).toBe(role);
        expect(await page.getByTestId(HOME_PANEL[role]).isVisible()).toBe(true);
        expect(await shell.navLabels()).toEqual(EXPECTED_NAV[role]);
        expect((await shell.userName().textContent())?.trim()).toBe(name);
        expect((await shell.userRole().textContent())?.trim()).toBe(ROLE_LABELS[role]);

        await shell.signOut();
        expect(new URL(page.url()).pathname).toBe("/sign-in");
        // Signed out means signed out: the home page sends us back to sign in.
        await page.goto(new URL("/home", testEnv.baseUrl).toString());
        expect(new URL(page.url()).pathname).toBe("/sign-in");
        await context.close();
      },
      journeyTimeout(1),
    );
  }
});
