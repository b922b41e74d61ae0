// The library draft editor's forms, in Chromium: a lead adds a material to a draft of the starting materials and sees
// each problem beside its field as they type (a source not named, a negative modulus, fu below fy, a further value's
// symbol, value and source on its own row), fixes them, saves,
// and the saved entry opens again in the form in MPa; in a draft of the load-combination sets, a factor of zero is
// named beside that factor. Both drafts are discarded at the end. The values are invented; the rules are the
// library's own (lib/libraries/document.ts).
import type { Page } from "playwright-core";
import { expect, it } from "vitest";
import { seriousViolations } from "../support/axe";
import { useBrowser, usePagesAs } from "../support/browser";
import { appUrl } from "../support/env";
import { demoSession, journeyTimeout } from "../support/pages";

const pageAs = usePagesAs(useBrowser());

async function startDraft(page: Page, slug: string) {
  await page.goto(appUrl(`/libraries/${slug}`));
  await page.getByTestId("start-library-draft").click();
  await page.waitForURL(/\/libraries\/drafts\/[0-9a-f-]{36}$/);
  await page.getByTestId("library-draft-editor").waitFor();
}

async function discardDraft(page: Page) {
  page.once("dialog", (dialog) => void dialog.accept());
  await page.getByTestId("draft-discard").click();
  await page.waitForURL((url) => !url.pathname.startsWith("/libraries/drafts/"), { timeout: 15_000 });
}

it(
  "a lead edits a material and a load-combination set in forms, each problem beside its field",
  async () => {
    const page = await pageAs(await demoSession("lead"));
    await startDraft(page, "materials");
    const before = await page.getByTestId("draft-entry").count();
    await page.getByTestId("draft-add-entry").click();
    const entry = page.getByTestId("draft-entry").nth(before);
    const form = entry.getByTestId("material-form");
    await form.waitFor();
    const errorOf = (id: string) => entry.getByTestId(id);

    // A new material names its values' sources as missing, beside each value.
    expect(await errorOf("material-E-source-error").textContent()).toBe(
      "Name the standard or source this value comes from (title, edition, clause).",
    );

    const name = `Invented grade ${Date.now().toString(36).slice(-5)}`;
    await entry.getByTestId("material-key").fill(name);
    await entry.getByTestId("material-E-value").fill("-5");
    await expect
      .poll(() => errorOf("material-E-value-error").textContent())
      .toBe("The Young's modulus E must be greater than zero.");
    await entry.getByTestId("material-fy-value").fill("500");
    await expect
      .poll(() => errorOf("material-fu-value-error").textContent())
      .toBe("The ultimate strength fu is below the yield strength fy.");
    // The library's own check says the same under the entry.
    expect(await entry.getByTestId("draft-entry-problem").allTextContents()).toContain(
      "fu: The ultimate strength fu is below the yield strength fy.",
    );

    // Fixed: every value with a source, fu above fy.
    await entry.getByTestId("material-E-value").fill("200000");
    await entry.getByTestId("material-fy-value").fill("355");
    for (const value of ["E", "G", "density", "fy", "fu"])
      await entry.getByTestId(`material-${value}-source`).fill("Invented for the test, not from a standard");

    // A further value: each problem beside its own field on the row, not only under the entry.
    await entry.getByRole("button", { name: "Add a further value" }).click();
    await entry.getByTestId("material-value-0-symbol").fill("f c");
    await entry.getByTestId("material-value-0-value").fill("abc");
    await expect
      .poll(() => errorOf("material-value-0-symbol-error").textContent())
      .toBe("A value's symbol is a short identifier: f_ck, f_m_k, E_0_05, rho_k…");
    expect(await errorOf("material-value-0-value-error").textContent()).toBe("The value must be a finite number.");
    expect(await errorOf("material-value-0-source-error").textContent()).toBe(
      "Name the standard or source this value comes from (title, edition, clause).",
    );
    await entry.getByTestId("material-value-0-symbol").fill("f_x");
    await entry.getByTestId("material-value-0-value").fill("2000000");
    await entry.getByTestId("material-value-0-source").fill("Invented for the test, not from a standard");
    await expect.poll(() => errorOf("material-value-0-symbol-error").count()).toBe(0);
    expect(await errorOf("material-value-0-value-error").count()).toBe(0);
    await expect.poll(() => entry.locator("[role=alert]").count()).toBe(0);
    expect(await entry.getByTestId("draft-entry-problem").count()).toBe(0);
    expect(await page.getByTestId("draft-problem-count").count()).toBe(0);
    expect(await seriousViolations(page)).toEqual([]);

    await page.getByTestId("draft-save").click();
    await expect.poll(() => page.getByTestId("draft-save-state").textContent(), { timeout: 20_000 }).toBe("Saved");
    // Opened again, the entry is there in the form, its modulus in MPa; as JSON, in pascals.
    await page.reload();
    const saved = page.locator(`[data-testid=draft-entry][data-key="${name}"]`);
    // Drawn with its values by the server already, before the page is hydrated.
    expect(await saved.getByTestId("material-E-value").inputValue()).toBe("200000");
    // The mode switch works once React has hydrated it (its node then carries React's own properties).
    const mode = saved.getByTestId("draft-entry-mode");
    await expect
      .poll(() => mode.evaluate((node) => Object.keys(node).some((key) => key.startsWith("__react"))), { timeout: 15_000 })
      .toBe(true);
    await mode.click();
    expect(JSON.parse(await saved.getByTestId("draft-entry-json").inputValue())).toMatchObject({
      key: name,
      E: { value: 200e9 },
      fy: { value: 355e6 },
    });
    await discardDraft(page);

    // A load-combination set: a factor of zero is named beside it.
    await startDraft(page, "load-combinations");
    const sets = await page.getByTestId("draft-entry").count();
    await page.getByTestId("draft-add-entry").click();
    const set = page.getByTestId("draft-entry").nth(sets);
    await set.getByTestId("combination-set-form").waitFor();
    await set.getByTestId("set-factor-0-D").fill("0");
    await expect
      .poll(() => set.getByTestId("set-factor-error-0-D").textContent())
      .toBe("A factor of zero takes no part: leave the load kind out instead.");
    await set.getByTestId("set-factor-0-D").fill("1.35");
    await expect.poll(() => set.getByTestId("set-factor-error-0-D").count()).toBe(0);
    await discardDraft(page);
  },
  journeyTimeout(1, 120_000),
);
