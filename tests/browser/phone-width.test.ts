// At a phone's width (390 px): wide tables scroll inside their own box with their first column held in
// place, and the navigation folds behind a "Menu" button that says whether it is open. That no page
// scrolls sideways, for anyone, is checked on every page by page-walk.test.ts.
import { afterAll, describe, expect, it } from "vitest";
import { useBrowser } from "../support/browser";
import { measureWidth, PHONE, visitorContexts } from "../support/app-pages";

const browser = useBrowser();
const visitors = visitorContexts(browser, PHONE);

afterAll(async () => {
  await visitors.closeAll();
});

describe("at 390 px", () => {
  it("the navigation is a menu behind a button that says whether it is open, and opening it widens nothing", async () => {
    const page = await visitors.open("auditor", "/home");
    const button = page.getByTestId("nav-menu-button");
    const link = page.getByTestId("nav-admin-users");
    expect(await button.isVisible()).toBe(true);
    expect(await button.getAttribute("aria-expanded")).toBe("false");
    expect(await link.isVisible()).toBe(false);
    await button.click();
    expect(await button.getAttribute("aria-expanded")).toBe("true");
    expect(await link.isVisible()).toBe(true);
    expect((await measureWidth(page)).scrollWidth).toBe(PHONE.width);
    // Following a link closes the menu on the new page.
    await link.click();
    await page.waitForURL((url) => url.pathname === "/admin/users");
    await page.getByTestId("users-table").waitFor();
    expect(await button.getAttribute("aria-expanded")).toBe("false");
    await page.close();
  });

  it("the People table scrolls in its own box, its first column (the name) staying in view", async () => {
    const page = await visitors.open("admin", "/admin/users");
    const box = page.getByTestId("users-table-scroll");
    const sizes = await box.evaluate((element) => ({ scrollWidth: element.scrollWidth, clientWidth: element.clientWidth }));
    expect(sizes.scrollWidth).toBeGreaterThan(sizes.clientWidth); // wider than a phone: it does scroll…
    await box.evaluate((element) => (element.scrollLeft = element.scrollWidth));
    const name = page.getByTestId("user-row").first().locator("td").first();
    const [boxLeft, nameLeft] = [(await box.boundingBox())!.x, (await name.boundingBox())!.x];
    expect(Math.abs(nameLeft - boxLeft)).toBeLessThan(2); // …and the name column stays at its left edge
    expect(await name.evaluate((cell) => getComputedStyle(cell).position)).toBe("sticky");
    expect((await measureWidth(page)).scrollWidth).toBe(PHONE.width);
    await page.close();
  });

  it("the user menu opens inside the window", async () => {
    const page = await visitors.open("engineer", "/home");
    await page.getByTestId("user-menu-button").click();
    const menu = page.getByTestId("user-menu");
    await menu.waitFor();
    expect((await measureWidth(page)).scrollWidth).toBe(PHONE.width);
    await page.close();
  });
});
