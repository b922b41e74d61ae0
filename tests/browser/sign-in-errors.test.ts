// The sign-in page's refusals, each in plain words, each leaving the visitor signed out. Malformed
// e-mails and too-short passwords are caught in the browser: no request reaches the server (and none
// is spent against its rate limit).
import type { Browser, Page } from "playwright-core";
import { afterAll, beforeAll, beforeEach, expect, it } from "vitest";
import { launchBrowser } from "../support/browser";
import { DEMO_BY_ROLE, SignInPage, journeyTimeout, uniqueEmail } from "../support/pages";

let browser: Browser;
let page: Page;
let signIn: SignInPage;
let signInRequests: number;

beforeAll(async () => {
  browser = await launchBrowser();
});

afterAll(async () => {
  await browser?.close();
});

beforeEach(async () => {
  const context = await browser.newContext();
  page = await context.newPage();
  signInRequests = 0;
  page.on("request", (request) => {
    if (request.method() === "POST" && request.url().includes("/api/auth/sign-in")) signInRequests += 1;
  });
  signIn = new SignInPage(page);
  await signIn.goto();
  return () => context.close();
});

async function expectStillSignedOut() {
  expect(new URL(page.url()).pathname).toBe("/sign-in");
  const cookies = await page.context().cookies();
  expect(cookies.some((cookie) => cookie.name.includes("session_token"))).toBe(false);
}

it(
  "wrong password: says the e-mail and password do not match",
  async () => {
    const admin = DEMO_BY_ROLE.admin;
    expect(await signIn.attempt(admin.email, `${admin.password}-wrong`)).toBe("error");
    expect(await signIn.formError().textContent()).toMatch(/do not match/i);
    await expectStillSignedOut();
  },
  journeyTimeout(1),
);

it(
  "unknown e-mail: the same words as a wrong password, so nobody can probe who has an account",
  async () => {
    expect(await signIn.attempt(uniqueEmail("nobody"), "correct-horse-battery")).toBe("error");
    expect(await signIn.formError().textContent()).toMatch(/do not match/i);
    await expectStillSignedOut();
  },
  journeyTimeout(1),
);

it("malformed e-mail: caught beside the field before anything is sent", async () => {
  await signIn.fillAndSubmit("not-an-email", "long-enough-password");
  await signIn.emailError().waitFor();
  expect(await signIn.emailError().textContent()).toMatch(/e-mail address like/i);
  expect(signInRequests).toBe(0);
  await expectStillSignedOut();
});

it("too-short password: caught beside the field before anything is sent", async () => {
  await signIn.fillAndSubmit(DEMO_BY_ROLE.engineer.email, "short");
  await signIn.passwordError().waitFor();
  expect(await signIn.passwordError().textContent()).toMatch(/at least 10 characters/i);
  expect(signInRequests).toBe(0);
  await expectStillSignedOut();
});

it("empty form: both fields say what is missing", async () => {
  await signIn.submitButton().click();
  await signIn.emailError().waitFor();
  expect(await signIn.emailError().textContent()).toMatch(/enter your e-mail/i);
  expect(await signIn.passwordError().textContent()).toMatch(/enter your password/i);
  expect(signInRequests).toBe(0);
});
