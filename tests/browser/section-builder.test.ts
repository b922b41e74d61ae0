// The section builder's screen, in Chromium: a channel typed in shows its shear centre and warping constant with their
// units and the convention they follow (the builder's rules 2), at a desktop's width and at a phone's, where the page
// still does not scroll sideways. PFC 300×90×41's dimensions (SCI P363); the values are the builder's own, checked
// against their closed forms in tests/libraries/section-torsion.test.ts.
import { afterAll, expect, it } from "vitest";
import { useBrowser } from "../support/browser";
import { measureWidth, PHONE, visitorContexts } from "../support/app-pages";

const browser = useBrowser();
const desktop = visitorContexts(browser, { width: 1280, height: 900 });
const phone = visitorContexts(browser, PHONE);

afterAll(async () => {
  await desktop.closeAll();
  await phone.closeAll();
});

it.each([
  ["desktop", desktop, 1280],
  ["phone", phone, PHONE.width],
] as const)(
  "at a %s's width, a channel's e0, x0, y0 and Cw are shown with their units and convention",
  async (_, visitors, width) => {
    const page = await visitors.open("engineer", "/libraries/builder");
    await page.getByTestId("section-builder").waitFor();
    await page.getByTestId("section-shape").selectOption("channel");
    for (const [key, mm] of Object.entries({ b: "90", d: "300", tf: "15.5", tw: "9", r: "12" }))
      await page.getByTestId(`section-dimension-${key}`).fill(mm);
    const row = (key: string) => page.locator(`[data-testid=section-properties-table] tr[data-property="${key}"]`);
    await row("Cw").waitFor();
    const cells = async (key: string) => (await row(key).locator("th, td").allTextContents()).map((text) => text.trim());
    // e0 = 3b′²tf/(6b′tf + h′tw) with b′ = 85.5 and h′ = 284.5 mm: 32.34 mm; Cw = 56.55 × 10⁹ mm⁶; x0 = tw/2 − e0 − xc
    // with xc = 26.01 mm: −53.85 mm.
    expect(await cells("e0")).toEqual(["e0", "shear centre from the web's mid-line, away from the flanges", "mm", "32.34"]);
    expect(await cells("Cw")).toEqual(["Cw", "warping constant", "10⁹ mm⁶", "56.55"]);
    expect(await cells("x0")).toEqual(["x0", "shear centre from the centroid, along x", "mm", "-53.85"]);
    expect(await cells("y0")).toEqual(["y0", "shear centre from the centroid, along y", "mm", "0"]);
    expect(await page.getByTestId("j-convention").textContent()).toContain("by the section builder's rules 2");
    expect(await page.getByTestId("warping-convention").textContent()).toContain("e0 = 3b′²tf/(6b′tf + h′tw)");
    expect((await measureWidth(page)).scrollWidth).toBe(width);
    await page.close();
  },
);

it("an I section with tapered flanges: the slope typed in per cent, drawn, named in the drawing's name and in the notes", async () => {
  const page = await desktop.open("engineer", "/libraries/builder");
  await page.getByTestId("section-builder").waitFor();
  await page.getByTestId("section-dimension-taper").fill("14");
  await expect
    .poll(() => page.getByTestId("section-drawing").locator("svg").getAttribute("aria-label"))
    .toMatch(/, inner flange slope 14 %$/);
  expect(await page.getByTestId("j-convention").textContent()).toContain("The flanges' inner faces slope 14 %");
  // A slope the flange cannot take is named beside the field, in words.
  await page.getByTestId("section-dimension-taper").fill("45");
  await expect.poll(() => page.getByTestId("section-dimension-taper-error").textContent()).toMatch(/thins the flange to nothing/);
  await page.close();
});
