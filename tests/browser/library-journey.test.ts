// The libraries' lifecycle in Chromium, as two standards leads live it: the first starts a new draft of the Firm
// sections library from its current version, builds a section in the section builder and adds it, saves and
// submits it, and is told that they cannot review it themselves; the second reads the difference (the section
// added), approves and publishes it, and the new version lists the section, drawn with its properties; then
// withdraws that section alone, with a reason. The draft page itself passes axe.
import { expect, it } from "vitest";
import { DEMO_USERS } from "@/db/demo-users";
import { seriousViolations } from "../support/axe";
import { useBrowser, usePagesAs } from "../support/browser";
import { appUrl } from "../support/env";
import { demoSession, journeyTimeout, signInOverHttp } from "../support/pages";

const browser = useBrowser();
const pageAs = usePagesAs(browser);

it(
  "a lead builds a section in a new draft of the firm's sections, a second lead approves it, and the new version holds it",
  async () => {
    const reviewer = DEMO_USERS.find((user) => user.email.startsWith("reviewer@"))!;
    const author = await pageAs(await demoSession("lead"));
    const second = await pageAs(await signInOverHttp(reviewer.email, reviewer.password));
    // An invented designation, new on every run.
    const designation = `JY-I 250x125 ${Date.now().toString(36).slice(-5)}`;

    // The first lead starts a draft from the library's current version; it opens in the editor.
    await author.goto(appUrl("/libraries/firm-sections"));
    const from = Number((await author.locator("h1 + p").textContent())?.match(/version (\d+)/)?.[1]);
    expect(from).toBeGreaterThanOrEqual(1);
    await author.getByTestId("start-library-draft").click();
    await author.waitForURL(/\/libraries\/drafts\/[0-9a-f-]{36}$/);
    const draftUrl = author.url();
    await author.getByTestId("library-draft-editor").waitFor();
    const before = await author.getByTestId("draft-entry").count();
    expect(before).toBeGreaterThan(0);
    expect(await author.getByTestId("draft-problem-count").count()).toBe(0);

    // The section is built from its dimensions (mm) and added under its designation.
    await author.getByTestId("open-add-section").click();
    await author.getByTestId("add-section-key").fill(designation);
    await author.getByTestId("section-shape").selectOption("i");
    for (const [key, mm] of Object.entries({ b: "125", d: "250", tf: "9", tw: "6", r: "12" }))
      await author.getByTestId(`section-dimension-${key}`).fill(mm);
    await author.getByTestId("section-properties").waitFor();
    await author.getByTestId("add-section-submit").click();
    const added = author.locator(`[data-testid=draft-entry][data-key="${designation}"]`);
    await added.waitFor();
    expect(await author.getByTestId("draft-entry").count()).toBe(before + 1);
    expect(await added.textContent()).toContain("No problems");
    expect(await author.getByTestId("draft-save-state").textContent()).toBe("Unsaved changes");

    // The editor page has nothing serious for axe.
    expect(await seriousViolations(author)).toEqual([]);

    await author.getByTestId("draft-save").click();
    await expect.poll(() => author.getByTestId("draft-save-state").textContent(), { timeout: 20_000 }).toBe("Saved");
    await author.getByTestId("draft-changelog").fill(`Adds ${designation}, built in the section builder.`);
    const submit = author.getByTestId("draft-submit");
    await expect.poll(() => submit.isEnabled(), { timeout: 15_000 }).toBe(true);
    await submit.click();
    // The page refreshes into the waiting state, which says why the author does not review it.
    const waiting = author.getByTestId("waiting-review");
    await waiting.waitFor();
    expect(await waiting.textContent()).toContain("You cannot review your own submission");
    expect(await author.getByTestId("draft-state").textContent()).toBe("In review");
    expect(await author.getByTestId("review-panel").count()).toBe(0);

    // The second lead opens it from the library's page, reads the difference and approves it.
    await second.goto(appUrl("/libraries/firm-sections"));
    await second.locator(`[data-testid=library-draft] a[href="${new URL(draftUrl).pathname}"]`).click();
    await second.getByTestId("review-panel").waitFor();
    const addedInDiff = second.getByTestId("entry-diff-added");
    expect(await addedInDiff.textContent()).toContain(designation);
    expect(await second.getByTestId("entry-diff-counts").textContent()).toContain("1 added, 0 removed, 0 changed");
    await second.getByTestId("review-approve").click();
    await second.waitForURL(new RegExp(`/libraries/firm-sections/versions/${from + 1}$`));

    // The new version holds the section: found in its catalogue table, and drawn with its properties.
    expect(await second.locator("h1 + p").textContent()).toContain(`version ${from + 1}`);
    expect(await second.getByTestId("library-version-facts").textContent()).toContain(reviewer.name);
    await second.getByTestId("catalogue-search").fill(designation);
    const link = second.getByRole("link", { name: designation });
    await link.click();
    await second.waitForURL(/\/entry\?key=/);
    expect(await second.locator("h1").textContent()).toBe(designation);
    expect(await second.getByTestId("entry-hash").textContent()).toMatch(/^[0-9a-f]{64}$/);
    expect(await second.getByTestId("section-properties").count()).toBeGreaterThan(0);

    // A wrong value found later: the second lead withdraws the section alone, with the reason, from its page.
    await second.getByTestId("withdraw-entry-reason").fill("tf is 9.2 mm on the mill's sheet, not 9 mm.");
    await second.getByTestId("withdraw-entry-submit").click();
    const withdrawn = second.getByTestId("entry-withdrawn");
    await withdrawn.waitFor();
    expect(await withdrawn.textContent()).toContain("tf is 9.2 mm on the mill's sheet, not 9 mm.");
  },
  journeyTimeout(2, 120_000),
);
