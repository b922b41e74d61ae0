// Keyboard use and where focus goes: the skip link comes first; the user menu follows the menu button
// pattern; after each action on the People page focus lands on what now stands in its place, with a
// message; an unsaved role choice is never dropped without asking; the sign-in page starts in its
// e-mail field.
import type { BrowserContext, Page } from "playwright-core";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { createTestUser } from "../integration/helpers/people";
import { useBrowser } from "../support/browser";
import { appUrl } from "../support/env";
import { PeoplePage, demoSession, journeyTimeout, toBrowserCookies, uniqueEmail } from "../support/pages";

const browser = useBrowser();
const contexts: BrowserContext[] = [];

async function pageAs(role: "admin" | "engineer" | null, path: string): Promise<Page> {
  const context = await browser().newContext();
  contexts.push(context);
  if (role) await context.addCookies(toBrowserCookies(await demoSession(role)));
  const page = await context.newPage();
  await page.goto(appUrl(path), { waitUntil: "load" });
  await page.waitForFunction(() => (window as unknown as { next?: { appDir?: boolean } }).next?.appDir === true);
  return page;
}

/** The focused element, described: its test id, else its tag and text. */
const focused = (page: Page) =>
  page.evaluate(() => {
    const element = document.activeElement as HTMLElement | null;
    return element?.dataset.testid ?? `${element?.tagName.toLowerCase()}#${element?.id}`;
  });

beforeAll(async () => {
  await demoSession("admin");
  await demoSession("engineer");
}, journeyTimeout(2));

afterAll(async () => {
  for (const context of contexts) await context.close();
});

describe("the skip link", () => {
  it("is the first thing Tab reaches, shows itself, and takes focus to the page's content", async () => {
    const page = await pageAs("engineer", "/home");
    await page.keyboard.press("Tab");
    expect(await focused(page)).toBe("skip-link");
    const link = page.getByTestId("skip-link");
    expect(await link.textContent()).toBe("Skip to content");
    expect((await link.boundingBox())!.width).toBeGreaterThan(50); // visible while focused, not a 1 px sr-only box
    await page.keyboard.press("Enter");
    expect(await focused(page)).toBe("app-main");
    // The next Tab goes into the page (a link on a home card), past the navigation and the user menu.
    await page.keyboard.press("Tab");
    expect(await page.evaluate(() => document.activeElement?.closest("main") !== null)).toBe(true);
  });
});

describe("the user menu", () => {
  const menuItems = (page: Page) => page.getByTestId("user-menu").getByRole("menuitem");

  it("opens from the keyboard on its first item, moves with the arrows, Home and End, and Escape returns to its button", async () => {
    const page = await pageAs("engineer", "/home");
    const button = page.getByTestId("user-menu-button");
    await button.focus();
    await page.keyboard.press("Enter");
    await page.getByTestId("user-menu").waitFor();
    expect(await button.getAttribute("aria-expanded")).toBe("true");
    const items = await menuItems(page).evaluateAll((elements) => elements.map((e) => e.textContent));
    expect(items.length).toBeGreaterThanOrEqual(1);
    const focusedItem = () => page.evaluate(() => document.activeElement?.textContent);
    expect(await focusedItem()).toBe(items[0]);
    await page.keyboard.press("ArrowDown");
    expect(await focusedItem()).toBe(items[1 % items.length]);
    await page.keyboard.press("End");
    expect(await focusedItem()).toBe(items.at(-1));
    await page.keyboard.press("Home");
    expect(await focusedItem()).toBe(items[0]);
    await page.keyboard.press("ArrowUp"); // wraps to the last
    expect(await focusedItem()).toBe(items.at(-1));
    await page.keyboard.press("Escape");
    expect(await page.getByTestId("user-menu").count()).toBe(0);
    expect(await focused(page)).toBe("user-menu-button");
    expect(await button.getAttribute("aria-expanded")).toBe("false");

    // ArrowUp on the button opens on the last item, ArrowDown and Space on the first; Tab closes it.
    await page.keyboard.press("ArrowUp");
    expect(await focusedItem()).toBe(items.at(-1));
    await page.keyboard.press("Escape");
    await page.keyboard.press("ArrowDown");
    expect(await focusedItem()).toBe(items[0]);
    await page.keyboard.press("Escape");
    await page.keyboard.press("Space");
    expect(await focusedItem()).toBe(items[0]);
    await page.keyboard.press("Tab");
    expect(await page.getByTestId("user-menu").count()).toBe(0);
  });
});

describe("the People page", () => {
  it(
    "after Deactivate, focus is on the row's Reactivate button with a message; after Reactivate, on Deactivate",
    async () => {
      const { actor: person } = await createTestUser({ role: "engineer", label: "focus" });
      const page = await pageAs("admin", "/admin/users");
      const people = new PeoplePage(page);
      const row = people.row(person.email);
      await row.getByTestId("user-deactivate").focus();
      await page.keyboard.press("Enter");
      expect(await focused(page)).toBe("user-deactivate-confirm");
      await page.keyboard.press("Enter");
      await people.row(person.email, '[data-status="deactivated"]').waitFor();
      await page.waitForFunction(() => document.activeElement?.getAttribute("data-testid") === "user-reactivate");
      expect(await page.evaluate(() => document.activeElement?.closest("tr")?.dataset.email)).toBe(person.email);
      expect(await row.getByTestId("user-row-status").textContent()).toMatch(/deactivated/);

      await page.keyboard.press("Enter");
      await people.row(person.email, '[data-status="active"]').waitFor();
      await page.waitForFunction(() => document.activeElement?.getAttribute("data-testid") === "user-deactivate");
      expect(await page.evaluate(() => document.activeElement?.closest("tr")?.dataset.email)).toBe(person.email);
      // Cancel in the confirmation goes back to the Deactivate button.
      await page.keyboard.press("Enter");
      await row.getByTestId("user-deactivate-cancel").click();
      expect(await focused(page)).toBe("user-deactivate");
    },
    journeyTimeout(1),
  );

  it(
    "an unsaved role choice is shown as unsaved, asked about before leaving, and kept when the person stays",
    async () => {
      const { actor: person } = await createTestUser({ role: "engineer", label: "unsaved" });
      const page = await pageAs("admin", "/admin/users");
      const people = new PeoplePage(page);
      const row = people.row(person.email);
      await row.getByTestId("user-role-select").selectOption("lead");
      expect(await row.getByTestId("user-role-unsaved").textContent()).toMatch(/unsaved: was engineer/i);
      expect(await row.getAttribute("data-unsaved")).toBe("true");

      // Leaving through the navigation asks first; staying keeps the choice.
      const asked: string[] = [];
      page.once("dialog", (dialog) => {
        asked.push(dialog.message());
        void dialog.dismiss();
      });
      await page.getByTestId("nav-home").click();
      await page.waitForTimeout(500);
      expect(asked).toEqual([expect.stringMatching(/without saving/)]);
      expect(new URL(page.url()).pathname).toBe("/admin/users");
      expect(await row.getByTestId("user-role-select").inputValue()).toBe("lead");

      // Reset puts the saved role back and focus on the select; nothing is unsaved any more.
      await row.getByTestId("user-role-reset").click();
      expect(await row.getByTestId("user-role-select").inputValue()).toBe("engineer");
      expect(await row.getByTestId("user-role-unsaved").count()).toBe(0);
      expect(await focused(page)).toBe("user-role-select");

      // Saved: focus stays on the select, and the row says so.
      await row.getByTestId("user-role-select").selectOption("auditor");
      await row.getByTestId("user-role-save").click();
      await people.row(person.email, '[data-role="auditor"]').waitFor();
      await page.waitForFunction(() => document.activeElement?.getAttribute("data-testid") === "user-role-select");
      expect(await row.getByTestId("user-row-status").textContent()).toBe("Role saved.");

      // With nothing unsaved, the navigation does not ask.
      page.once("dialog", (dialog) => {
        asked.push(dialog.message());
        void dialog.accept();
      });
      await page.getByTestId("nav-home").click();
      await page.waitForURL((url) => url.pathname === "/home");
      expect(asked).toHaveLength(1);
    },
    journeyTimeout(1),
  );

  it(
    "after sending an invitation focus is on the confirmation; after cancelling one, on the message that says so",
    async () => {
      const page = await pageAs("admin", "/admin/users");
      const people = new PeoplePage(page);
      const email = uniqueEmail("focus-invite");
      await people.invite({ name: "Focus Invitee", email, role: "engineer" });
      await page.waitForFunction(() => document.activeElement?.querySelector('[data-testid="invite-sent"]') !== null);

      const invitation = people.pendingInvitation(email);
      expect(await invitation.getByTestId("invitation-cancel").textContent()).toBe("Cancel invitation");
      await invitation.getByTestId("invitation-cancel").click();
      await invitation.waitFor({ state: "detached" });
      await page.waitForFunction(() => document.activeElement?.getAttribute("data-testid") === "invitation-cancelled");
      expect(await page.getByTestId("invitation-cancelled").textContent()).toContain(`Invitation to ${email} cancelled`);
    },
    journeyTimeout(1),
  );

  it("the invitation form asks for an e-mail address in words that fit someone else's", async () => {
    const page = await pageAs("admin", "/admin/users");
    await page.getByTestId("invite-name").fill("Nobody Yet");
    await page.getByTestId("invite-submit").click();
    await page.getByTestId("invite-email-error").waitFor();
    expect(await page.getByTestId("invite-email-error").textContent()).toBe("Enter an e-mail address.");
    expect(await focused(page)).toBe("invite-email");
  });
});

describe("the sign-in page", () => {
  it("has focus in the e-mail field on load", async () => {
    const page = await pageAs(null, "/sign-in");
    await page.waitForFunction(() => document.activeElement?.getAttribute("data-testid") === "email", undefined, {
      timeout: 5_000,
    });
    expect(await focused(page)).toBe("email");
  });
});
