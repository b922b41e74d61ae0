// The libraries' lifecycle in Chromium, as two standards leads live it: the first starts a new draft of the Firm
// sections library from its current version, builds a section in the section builder and adds it, saves and
// submits it, and is told that they cannot review it themselves; the second reads the difference (the section
// added), approves and publishes it, and the new version lists the section, drawn with its properties. A standard
// whose beam takes an I section from the firm's sections at `latest` is published next (by two other leads, through
// the use cases), so it is pinned to that new version; an engineer opens a job, runs it, finds the new section in the
// run form's picker by searching and filtering by shape, runs, and the run's page names the section, its library
// version and its entry hash. Then the second lead withdraws that section alone, with a reason. The draft page
// itself passes axe. The standard's verification case is the deflection 5wL⁴/384EI (AWC Design Aid No. 6 (2005),
// Fig. 1), with Ix as the firm's catalogue lists it.
import { expect, it } from "vitest";
import { DEMO_USERS } from "@/db/demo-users";
import { seriousViolations } from "../support/axe";
import { useBrowser, usePagesAs } from "../support/browser";
import { appUrl } from "../support/env";
import { demoSession, journeyTimeout, signInOverHttp } from "../support/pages";
import { runUseCase } from "@/lib/use-cases/run";
import { approveAndPublish, createStandard, saveDraft, submitDraft } from "@/lib/use-cases/standards";
import { readLibraryVersion } from "@/lib/use-cases/library-reads";
import type { Actor } from "@/lib/domain/actor";
import { createTestUser } from "../integration/helpers/people";
import { beamSource } from "../integration/helpers/library-standard";
import { uniqueLabel } from "../integration/helpers/withdrawal-fixtures";

const browser = useBrowser();
const pageAs = usePagesAs(browser);

/**
 * Two leads publish a beam on the firm's sections at `latest`: its default GI 300x150x10.5, its case GI 400x180x13.5
 * with the Ix the catalogue lists (what the evaluation reads). Returns the standard's slug.
 */
async function publishBeamOnFirmSections(libraryVersion: number): Promise<string> {
  const [author, reviewer] = await Promise.all([
    createTestUser({ role: "lead", label: "journey-std-a" }),
    createTestUser({ role: "lead", label: "journey-std-b" }),
  ]);
  const version = await runUseCase(readLibraryVersion, {
    actor: author.actor,
    input: { slug: "firm-sections", number: libraryVersion },
  });
  const checked = (version.document as { entries: { key: string; properties: { Ix: number } }[] }).entries.find(
    (entry) => entry.key === "GI 400x180x13.5",
  )!;
  const slug = uniqueLabel("firm-beam");
  const title = `Beam on a firm section ${slug.slice(-6)}`;
  const source = beamSource("firm-sections", checked.properties.Ix, {
    default: "GI 300x150x10.5",
    checked: "GI 400x180x13.5",
    title,
  });
  const publish = async (lead: Actor, second: Actor) => {
    const { draftId } = await runUseCase(createStandard, { actor: lead, input: { slug, title } });
    const saved = await runUseCase(saveDraft, { actor: lead, input: { draftId, source } });
    expect(saved.check.problems).toEqual([]);
    const { reviewId } = await runUseCase(submitDraft, { actor: lead, input: { draftId, changelog: "First version." } });
    await runUseCase(approveAndPublish, { actor: second, input: { reviewId } });
  };
  await publish(author.actor, reviewer.actor);
  return slug;
}

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
    const entryHash = (await second.getByTestId("entry-hash").textContent())!;
    expect(entryHash).toMatch(/^[0-9a-f]{64}$/);
    expect(await second.getByTestId("section-properties").count()).toBeGreaterThan(0);
    const entryUrl = second.url();

    // A standard on the firm's sections, published now: its `latest` is pinned to the version holding the section.
    const slug = await publishBeamOnFirmSections(from + 1);
    const engineer = await pageAs(await demoSession("engineer"));
    await engineer.goto(appUrl(`/standards/${slug}`));
    const pin = engineer.locator("[data-testid=library-pin][data-library=firm-sections]");
    expect(await pin.getAttribute("data-version")).toBe(String(from + 1));
    expect(await pin.textContent()).toContain("pinned when this version was published");

    // The engineer runs it in a job and picks the new section: searched for, filtered to I sections.
    await engineer.goto(appUrl("/jobs/MF-2304"));
    await engineer.locator(`[data-testid=run-standard-link][data-slug="${slug}"]`).click();
    await engineer.waitForURL(new RegExp(`/jobs/MF-2304/run/${slug}$`));
    const picker = engineer.getByTestId("picker-beam");
    await picker.waitFor();
    expect(await picker.textContent()).toContain(`firm-sections v${from + 1}`);
    await engineer.getByTestId("picker-type-beam").selectOption("i");
    await engineer.getByTestId("picker-search-beam").fill(designation.split(" ").pop()!);
    const offered = engineer.getByTestId("field-beam").locator("option");
    await expect.poll(() => offered.allTextContents()).toContain(`${designation} (i)`);
    await engineer.getByTestId("field-beam").selectOption(designation);
    const preview = engineer.getByTestId("run-preview");
    await expect.poll(() => preview.getAttribute("data-status"), { timeout: 30_000 }).toBe("ready");
    await engineer.getByTestId("run-submit").click();
    await engineer.waitForURL(/\/runs\/[0-9a-f-]{36}$/, { timeout: 30_000 });
    // The run's page names the section, the library version it came from and the entry's hash.
    const used = await engineer.getByTestId("run-library-entries").textContent();
    expect(used).toContain(`beam: ${designation} (firm-sections v${from + 1}, sha256:${entryHash.slice(0, 12)})`);
    // Its trace gives the whole hash.
    await engineer.goto(`${engineer.url()}/trace`);
    expect(await engineer.getByTestId("trace-library-entries").textContent()).toContain(`sha256:${entryHash}`);
    await second.goto(entryUrl);

    // A wrong value found later: the second lead withdraws the section alone, with the reason, from its page.
    await second.getByTestId("withdraw-entry-reason").fill("tf is 9.2 mm on the mill's sheet, not 9 mm.");
    await second.getByTestId("withdraw-entry-submit").click();
    const withdrawn = second.getByTestId("entry-withdrawn");
    await withdrawn.waitFor();
    expect(await withdrawn.textContent()).toContain("tf is 9.2 mm on the mill's sheet, not 9 mm.");
  },
  journeyTimeout(3, 180_000),
);
