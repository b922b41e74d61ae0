// An admin invites someone through the people page; the e-mail really arrives at the fake SMTP server
// (and shows in the admin's demo mailbox); the link opens the invitation page, which says who is
// invited and as what; choosing a password signs the new person in with that role; the link then
// refuses a second use; and the new person can sign in again with the password they chose.
import type { Browser, BrowserContext } from "playwright-core";
import { afterAll, beforeAll, expect, it } from "vitest";
import { launchBrowser } from "../support/browser";
import { appUrl } from "../support/env";
import { firstLink, waitForMessage } from "../support/mailbox";
import {
  AppShell,
  InvitationPage,
  PeoplePage,
  SignInPage,
  demoSession,
  toBrowserCookies,
  journeyTimeout,
  uniqueEmail,
} from "../support/pages";

let browser: Browser;
let adminContext: BrowserContext;

beforeAll(async () => {
  browser = await launchBrowser();
  adminContext = await browser.newContext();
  await adminContext.addCookies(toBrowserCookies(await demoSession("admin")));
}, journeyTimeout(1));

afterAll(async () => {
  await browser?.close();
});

it(
  "invite → e-mail → accept → signed in as the invited role → link used up → sign in again",
  async () => {
    const invitee = { name: "Odile Fairbank-Tse", email: uniqueEmail("invitee"), role: "lead" as const };
    const password = "gusset-plate-bolt-row";

    // The admin sends the invitation from the people page.
    const adminPage = await adminContext.newPage();
    const people = new PeoplePage(adminPage);
    await people.goto();
    await people.invite(invitee);
    await people.pendingInvitation(invitee.email).waitFor();

    // The e-mail reached the SMTP server, addressed to the invitee, with the link in it.
    const message = await waitForMessage({ to: invitee.email, subjectIncludes: "invited", timeoutMs: 15_000 });
    const link = firstLink(message);
    expect(new URL(link).pathname).toMatch(/^\/invite\/[A-Za-z0-9_-]{20,}$/);

    // The demo mailbox shows the same message, with the link clickable.
    await adminPage.goto(appUrl("/admin/mailbox"));
    const item = adminPage.locator(`[data-testid="mail-item"][data-to*="${invitee.email}"]`).first();
    await item.waitFor();
    expect(await item.getByTestId("mail-link").first().getAttribute("href")).toBe(link);

    // The invitee, in their own browser, opens the link.
    const inviteeContext = await browser.newContext();
    const page = await inviteeContext.newPage();
    const invitation = new InvitationPage(page);
    await invitation.open(link);
    expect(await invitation.invitedName().textContent()).toContain(invitee.name);
    expect(await invitation.invitedName().textContent()).toContain(invitee.email);
    expect((await invitation.invitedRole().textContent())?.trim()).toBe("Standards lead");

    // Mismatched and short passwords are refused beside the fields.
    await invitation.submitPasswords(password, `${password}x`);
    await invitation.confirmError().waitFor();
    expect(await invitation.confirmError().textContent()).toMatch(/differ/i);
    await invitation.submitPasswords("short");
    await invitation.passwordError().waitFor();
    expect(await invitation.passwordError().textContent()).toMatch(/at least 10/i);

    // A good password: signed in, on the home page, as a standards lead.
    await invitation.accept(password);
    const shell = new AppShell(page);
    await shell.home().waitFor();
    expect(await shell.home().getAttribute("data-role")).toBe("lead");
    expect((await shell.userName().textContent())?.trim()).toBe(invitee.name);
    expect(await shell.navLabels()).toEqual(["Home", "Standards", "Libraries", "Jobs", "Runs", "Withdrawals"]);

    // The link works once.
    await invitation.open(link);
    expect(await invitation.unusable().getAttribute("data-status")).toBe("used");
    expect(await invitation.unusableMessage().textContent()).toMatch(/already been used/i);

    // The admin's list now shows the person, active, and no longer as a pending invitation.
    await people.goto();
    expect(await people.row(invitee.email).getAttribute("data-status")).toBe("active");
    expect(await people.row(invitee.email).getAttribute("data-role")).toBe("lead");
    expect(await people.pendingInvitation(invitee.email).count()).toBe(0);

    // Signed out, the new person signs in with the password they chose.
    await page.goto(appUrl("/home"));
    await shell.signOut();
    const signIn = new SignInPage(page);
    await signIn.signIn(invitee.email, password);
    await shell.home().waitFor();
    expect(await shell.home().getAttribute("data-role")).toBe("lead");
    await inviteeContext.close();
  },
  journeyTimeout(2),
);

it("an unknown invitation link says so plainly", async () => {
  const page = await browser.newPage();
  const invitation = new InvitationPage(page);
  await invitation.open(appUrl("/invite/this-token-was-never-issued-0000000000"));
  expect(await invitation.unusable().getAttribute("data-status")).toBe("unknown");
  expect(await invitation.unusableMessage().textContent()).toMatch(/not valid/i);
  await page.close();
});

it("a second invitation to an address that already has an account is refused beside the e-mail field", async () => {
  const page = await adminContext.newPage();
  const people = new PeoplePage(page);
  await people.goto();
  await people.submitInvitation({ name: "Someone Again", email: "engineer@marrowby-fenn.example", role: "engineer" });
  await people.inviteEmailError().waitFor();
  expect(await people.inviteEmailError().textContent()).toMatch(/already has an account/i);
  await page.close();
});
