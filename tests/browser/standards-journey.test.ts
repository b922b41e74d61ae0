// The standards lifecycle in Chromium, as two standards leads live it: the first writes a small standard in
// the editor and sees its preview, submits it; the second returns it with a comment on a line; the first
// fixes it and submits again; the second approves it, and it is published as version 1 and listed under
// Standards with its equations typeset. The editor page itself passes axe.
import type { Page } from "playwright-core";
import { expect, it } from "vitest";
import { DEMO_USERS } from "@/db/demo-users";
import { seriousViolations } from "../support/axe";
import { useBrowser, usePagesAs } from "../support/browser";
import { appUrl } from "../support/env";
import { demoSession, journeyTimeout, signInOverHttp } from "../support/pages";

const browser = useBrowser();
const pageAs = usePagesAs(browser);

/** Types at the end of the CodeMirror source (inside its shadow root; Playwright's CSS locators pierce it). */
async function appendToSource(page: Page, text: string): Promise<void> {
  const content = page.locator("[data-testid=source-editor] .cm-content");
  await content.click();
  await page.keyboard.press("Control+End");
  await page.keyboard.type(text);
}

async function saveDraft(page: Page): Promise<void> {
  await page.getByTestId("draft-save").click();
  await expect.poll(() => page.getByTestId("draft-save-state").textContent(), { timeout: 20_000 }).toBe("Saved");
}

async function submitDraft(page: Page, changelog: string): Promise<void> {
  await page.getByTestId("draft-changelog").fill(changelog);
  const submit = page.getByTestId("draft-submit");
  await expect.poll(() => submit.isEnabled(), { timeout: 15_000 }).toBe(true);
  await submit.click();
  // The page refreshes into the waiting state: the editor gives way to who reviews next.
  await page.getByTestId("waiting-review").waitFor();
  expect(await page.getByTestId("draft-state").textContent()).toBe("In review");
}

it(
  "a lead writes a standard, a second lead returns it with a comment, then approves it, and it is published",
  async () => {
    const reviewer = DEMO_USERS.find((user) => user.email.startsWith("reviewer@"))!;
    const author = await pageAs(await demoSession("lead"));
    const second = await pageAs(await signInOverHttp(reviewer.email, reviewer.password));
    const slug = `journey-${Date.now().toString(36)}`;
    const title = `Journey cantilever ${slug.slice(-4)}`;

    // The first lead starts a new standard: a working draft opens in the editor, with its preview.
    await author.goto(appUrl("/standards/new"));
    await author.getByTestId("new-standard-title").fill(title);
    await author.getByTestId("new-standard-slug").fill(slug);
    await author.getByTestId("new-standard-submit").click();
    await author.waitForURL(/\/standards\/drafts\/[0-9a-f-]{36}$/);
    const draftUrl = author.url();
    await author.locator("[data-testid=source-editor] .cm-content").waitFor();
    const preview = author.getByTestId("draft-preview");
    expect(await preview.locator(".katex").count()).toBeGreaterThan(0);
    expect(await preview.getByTestId("check").first().getAttribute("data-name")).toBe("bending");

    // The editor page has nothing serious for axe (CodeMirror's shadow root included).
    expect(await seriousViolations(author)).toEqual([]);

    await appendToSource(author, "\nThe bending check governs for this member.\n");
    expect(await author.getByTestId("draft-save-state").textContent()).toBe("Unsaved changes");
    // The preview follows the typing: a moment later it shows the new sentence, from the text not yet saved.
    const live = author.getByTestId("live-preview");
    await expect
      .poll(() => live.getByTestId("live-preview-state").textContent(), { timeout: 20_000 })
      .toBe("Up to date with the editor.");
    expect(await live.textContent()).toContain("The bending check governs for this member.");
    expect(await author.getByTestId("draft-preview").count()).toBe(0);
    await saveDraft(author);
    await preview.waitFor();
    await submitDraft(author, "First version.");

    // The second lead finds it waiting and returns it with a comment on line 5 (the summary).
    await second.goto(appUrl("/standards"));
    const waiting = second.getByTestId("draft-row").filter({ hasText: slug });
    expect(await waiting.textContent()).toContain("Waiting for your review");
    await waiting.getByRole("link", { name: slug }).click();
    await second.getByTestId("review-panel").waitFor();
    await second.getByTestId("review-line").fill("5");
    await second.getByTestId("review-line").press("Enter");
    await second.getByTestId("review-comment-body").fill("The summary is still the placeholder.");
    await second.getByTestId("review-return").click();
    // The page refreshes: the submission is listed as returned, with the comment on its line.
    await second
      .getByTestId("review-round")
      .filter({ hasText: `Returned by ${reviewer.name}` })
      .waitFor();
    expect(await second.getByTestId("review-panel").count()).toBe(0);

    // The first lead sees the comment beside its line, fixes the summary and submits again.
    await author.goto(draftUrl);
    const comment = author.getByTestId("review-comment").first();
    expect(await comment.getAttribute("data-line")).toBe("5");
    expect(await comment.textContent()).toContain("The summary is still the placeholder.");
    expect(await author.getByTestId("draft-state").textContent()).toBe("Returned for changes");
    const line5 = author.locator("[data-testid=source-editor] .cm-line").nth(4);
    await line5.click();
    await author.keyboard.press("End");
    await author.keyboard.press("Shift+Home");
    await author.keyboard.type("summary: A cantilever under a uniform load, checked in bending.");
    await saveDraft(author);
    await submitDraft(author, "First version, summary written.");

    // The second lead approves: the version is published and its page opens.
    await second.goto(draftUrl);
    await second.getByTestId("review-approve").click();
    await second.waitForURL(new RegExp(`/standards/${slug}/versions/1$`));
    expect(await second.getByTestId("version-number").textContent()).toBe("v1");
    expect(await second.getByTestId("version-reviewer").textContent()).toContain(reviewer.name);
    expect(await second.getByTestId("content-hash").textContent()).toMatch(/^sha256:[0-9a-f]{64}$/);

    // Listed under Standards for everyone who reads them, equations typeset.
    const engineer = await pageAs(await demoSession("engineer"));
    await engineer.goto(appUrl(`/standards?q=${slug}`));
    const row = engineer.getByTestId("standard-row");
    expect(await row.count()).toBe(1);
    expect(await row.getAttribute("data-slug")).toBe(slug);
    await row.getByTestId("standard-link").click();
    await engineer.waitForURL(new RegExp(`/standards/${slug}$`));
    expect(await engineer.getByTestId("narrative").locator(".katex").count()).toBeGreaterThan(0);
    expect(await engineer.getByTestId("derivation").getAttribute("data-of")).toBe("phi_M_n");
    expect(await engineer.getByTestId("caution").isVisible()).toBe(true);
    expect(await engineer.locator("main").textContent()).toContain("A cantilever under a uniform load, checked in bending.");
  },
  journeyTimeout(2, 120_000),
);
