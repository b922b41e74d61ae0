// A role change reaches a page that is already open: the shell (navigation, user menu) is drawn by a
// layout that client navigation does not render again, so the next navigation asks the server who the
// person is now and redraws it. An auditor demoted while signed in loses "Audit trail" at their next
// click, and the 403 page they may still reach names their new role; a promotion adds the new entries.
import { expect, it } from "vitest";
import { useBrowser } from "../support/browser";
import { AppShell, invitePersonAndAccept, journeyTimeout, openPeopleAsAdmin, uniqueEmail } from "../support/pages";

const browser = useBrowser();

it(
  "a demotion and a promotion reach the person's open page at their next navigation",
  async () => {
    const person = { name: "Sam Reed", email: uniqueEmail("reed"), role: "auditor" as const, password: "auditing-all-day-long" };
    const { context: adminContext, people } = await openPeopleAsAdmin(browser());
    const { context, page } = await invitePersonAndAccept(browser(), people, person);
    const shell = new AppShell(page);
    expect(await shell.navLabels()).toContain("Audit trail");
    expect(await shell.userRole().textContent()).toBe("QA auditor");

    // Demoted in the admin's browser while this page stays open.
    await people.goto();
    await people.setRole(person.email, "engineer");

    // The stale "Audit trail" entry is still on screen; following it shows the 403 page naming the new role …
    await page.getByTestId("nav-audit").click();
    const forbidden = page.getByTestId("forbidden-page");
    await forbidden.waitFor();
    await expect.poll(() => page.getByTestId("forbidden-role").textContent(), { timeout: 10_000 }).toBe("Engineer");
    expect(await page.getByTestId("forbidden-name").textContent()).toBe(person.name);
    expect(await page.getByTestId("forbidden-for").textContent()).toBe("This page is for the Admin and QA auditor roles.");
    // … and the shell is redrawn for the engineer: no "Audit trail", the engineer's entries, the new role.
    await page.getByTestId("nav-audit").waitFor({ state: "detached", timeout: 10_000 });
    await page.locator('[data-testid="user-role"]', { hasText: "Engineer" }).waitFor();
    expect(await shell.navLabels()).not.toContain("Audit trail");

    // Loaded afresh, the 403 page names the new role at once.
    await page.reload();
    await forbidden.waitFor();
    expect(await page.getByTestId("forbidden-role").textContent()).toBe("Engineer");

    // A promotion to admin: the next click brings People (and the audit trail) into the navigation.
    await people.goto();
    await people.setRole(person.email, "admin");
    await page.getByTestId("nav-home").click();
    await page.getByTestId("nav-admin-users").waitFor({ timeout: 10_000 });
    expect(await shell.navLabels()).toEqual(expect.arrayContaining(["Audit trail", "People"]));
    expect(await shell.userRole().textContent()).toBe("Admin");

    await context.close();
    await adminContext.close();
  },
  journeyTimeout(1),
);
