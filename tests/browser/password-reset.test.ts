// Password reset end to end, for a person created by invitation in this run (so the demo logins are
// never changed): ask for a link, receive it at the fake SMTP server, choose a new password, sign in
// with it. The link then refuses a second use.
import type { Browser } from "playwright-core";
import { afterAll, beforeAll, expect, it } from "vitest";
import { launchBrowser } from "../support/browser";
import { appUrl } from "../support/env";
import { firstLink, waitForMessage } from "../support/mailbox";
import {
  AppShell,
  ForgotPasswordPage,
  ResetPasswordPage,
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
  "request → e-mail → link → new password → sign in with it",
  async () => {
    const person = {
      name: "Rafe Lindqvist-Oduya",
      email: uniqueEmail("reset"),
      role: "engineer" as const,
      password: "first-password-for-reset",
    };
    const newPassword = "second-password-after-reset";

    // Someone to reset: invited by the admin and accepted, all through the pages.
    const admin = await openPeopleAsAdmin(browser);
    const { context, page } = await invitePersonAndAccept(browser, admin.people, person);
    await admin.context.close();
    const shell = new AppShell(page);
    await shell.signOut();

    // "Forgot your password?" from the sign-in page.
    await page.getByTestId("forgot-password-link").click();
    await page.waitForURL((url) => url.pathname === "/forgot-password");
    const forgot = new ForgotPasswordPage(page);
    await forgot.request(person.email);
    expect(await forgot.requested().textContent()).toContain(person.email);

    const resetMail = await waitForMessage({ to: person.email, subjectIncludes: "Reset", timeoutMs: 15_000 });
    const link = firstLink(resetMail);
    expect(new URL(link).pathname).toBe("/reset-password");

    const reset = new ResetPasswordPage(page);
    await reset.open(link);
    await reset.submit(newPassword, `${newPassword}-typo`);
    await page.getByTestId("confirm-password-error").waitFor();
    await reset.submit(newPassword);
    await page.waitForURL((url) => url.pathname === "/sign-in");
    const signIn = new SignInPage(page);
    expect(await signIn.formNotice().textContent()).toMatch(/password has been changed/i);

    await signIn.signIn(person.email, newPassword);
    await shell.home().waitFor();
    expect(await shell.home().getAttribute("data-role")).toBe("engineer");

    // The link was used up.
    await reset.open(link);
    await reset.submit("a-third-password-attempt");
    await reset.formError().waitFor();
    expect(await reset.formError().textContent()).toMatch(/invalid, used or expired/i);
    await context.close();
  },
  journeyTimeout(2),
);

it("a reset link without a token says it cannot be used", async () => {
  const page = await browser.newPage();
  const reset = new ResetPasswordPage(page);
  await reset.open(appUrl("/reset-password?error=INVALID_TOKEN"));
  await reset.linkInvalid().waitFor();
  expect(await reset.linkInvalid().textContent()).toMatch(
    /This link cannot be used.*expired, has already been used, or was copied incompletely/,
  );
  // No form to send, only the way to a new link.
  expect(await page.getByTestId("reset-password-form").count()).toBe(0);
  expect(await reset.linkInvalid().getByRole("link").getAttribute("href")).toBe("/forgot-password");
  await page.close();
});
