// The served test build opens in Debian's chromium: a visitor who is not signed in who opens the
// app's address is sent to the sign-in page, which renders with its own title and form.
import { expect, it } from "vitest";
import { useBrowser } from "../support/browser";
import { testEnv } from "../support/env";

const browser = useBrowser();

it("opens the app's home page", async () => {
  const page = await browser().newPage();
  const response = await page.goto(testEnv.baseUrl, { waitUntil: "load" });
  expect(response?.status()).toBe(200);
  expect(new URL(page.url()).pathname).toBe("/sign-in");
  expect(await page.title()).toBe("Sign in · Gusset");
  expect(await page.getByTestId("sign-in-submit").isVisible()).toBe(true);
  await page.close();
});
