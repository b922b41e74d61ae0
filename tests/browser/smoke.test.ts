// The served test build opens in Debian's chromium: an answer below 500 and a page title.
import { expect, it } from "vitest";
import { useBrowser } from "../support/browser";
import { testEnv } from "../support/env";

const browser = useBrowser();

it("opens the app's home page", async () => {
  const page = await browser().newPage();
  const response = await page.goto(testEnv.baseUrl, { waitUntil: "load" });
  expect(response, "no HTTP response").not.toBeNull();
  expect(response!.status()).toBeLessThan(500);
  expect((await page.title()).trim()).not.toBe("");
  await page.close();
});
