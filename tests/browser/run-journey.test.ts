// An engineer's day in Chromium: open a job, run the fixed-end beam, watch the live preview follow the typing
// (computed by the evaluation bundle in a Web Worker), run it, and read the stored run: pass or fail, each check's
// utilisation, the moment diagram. The results page passes axe. Its calc sheet downloads as a PDF rendered on the
// server (pdftotext reads the run id, version and hash on every page). Then the run is issued as revision A of a calc,
// a second engineer (the demo reviewer, a lead) checks it, and the job's responsible engineer approves it. The preview's figures are the frame engine's:
// a fixed-end beam under uniform load has end moments wL²/12 (AISC Steel Construction Manual, 15th ed.,
// Table 3-23, case 15, from memory).
import { createHash } from "node:crypto";
import fs from "node:fs";
import type { Locator, Page } from "playwright-core";
import { expect, it } from "vitest";
import { seriousViolations } from "../support/axe";
import { useBrowser, usePagesAs } from "../support/browser";
import { appUrl } from "../support/env";
import { DEMO_USERS } from "@/db/demo-users";
import { demoSession, journeyTimeout, signInOverHttp } from "../support/pages";
import { pdfPages } from "../support/pdf";

/** Reloads the run's page until its record is sealed in the log; the leaf hash and head digest shown. */
async function waitForSeal(page: Page): Promise<{ leafHash: string; digest: string }> {
  const deadline = Date.now() + 30_000;
  while (!(await page.getByTestId("seal-panel").isVisible())) {
    if (Date.now() > deadline) throw new Error("the run was not sealed in the log within 30 s");
    await page.waitForTimeout(1000);
    await page.reload();
  }
  return {
    leafHash: (await page.getByTestId("seal-leaf-hash").textContent())!.trim(),
    digest: (await page.getByTestId("seal-head-digest").textContent())!.trim(),
  };
}

/** Clicks a link that downloads a PDF; the bytes' sha256 (checked against the server's header) and each page's text. */
async function downloadPdf(page: Page, link: Locator): Promise<{ sha256: string; pages: string[] }> {
  const [download] = await Promise.all([page.waitForEvent("download", { timeout: 60_000 }), link.click()]);
  const body = new Uint8Array(fs.readFileSync((await download.path())!));
  expect(download.suggestedFilename()).toMatch(/^calc-sheet-run-[0-9a-f]{8}-[0-9a-f]{12}\.pdf$/);
  const sha256 = createHash("sha256").update(body).digest("hex");
  expect(download.suggestedFilename()).toContain(sha256.slice(0, 12));
  return { sha256, pages: pdfPages(body) };
}

const pageAs = usePagesAs(useBrowser());

const utilisationOf = (page: Page, check: string) =>
  page.locator(`[data-testid=preview-check][data-name=${check}]`).getAttribute("data-utilisation");

it(
  "an engineer runs the fixed-end beam in a job, the preview follows the typing, and the stored run shows its checks and diagrams",
  async () => {
    const page = await pageAs(await demoSession("engineer"));
    const refused: string[] = [];
    page.on("console", (message) => {
      if (message.type() === "error") refused.push(message.text());
    });

    await page.goto(appUrl("/jobs/MF-2304"));
    await page.locator("[data-testid=run-standard-link][data-slug=fixed-end-beam]").click();
    await page.waitForURL(/\/jobs\/MF-2304\/run\/fixed-end-beam$/);

    // The form is there before the worker: the preview says it is loading, then shows the defaults' result.
    await page.getByTestId("field-L").waitFor();
    const preview = page.getByTestId("run-preview");
    await expect.poll(() => preview.getAttribute("data-status"), { timeout: 30_000 }).toBe("ready");
    const atDefaults = await utilisationOf(page, "bending");

    // A longer span in feet: the field shows it in metres, and the preview's bending utilisation grows with L².
    await page.getByTestId("field-L").fill("29.5276 ft");
    await expect.poll(() => page.getByText("= 9 m").count(), { timeout: 10_000 }).toBe(1);
    await expect.poll(() => utilisationOf(page, "bending"), { timeout: 15_000 }).not.toBe(atDefaults);
    const at9 = Number(await utilisationOf(page, "bending"));
    expect(at9).toBeGreaterThan(Number(atDefaults));

    // A wrong dimension is refused beside its field before anything is sent.
    await page.getByTestId("field-w_D").fill("8 kN");
    await page.getByTestId("run-submit").click();
    await expect
      .poll(() => page.getByRole("alert").allTextContents(), { timeout: 10_000 })
      .toContainEqual(expect.stringMatching(/^Dead load: /));
    expect(page.url()).toMatch(/\/run\/fixed-end-beam$/);
    await page.getByTestId("field-w_D").fill("8 kN/m");

    await page.getByTestId("run-submit").click();
    await page.waitForURL(/\/runs\/[0-9a-f-]{36}$/, { timeout: 30_000 });
    expect(await page.getByTestId("caution").count()).toBe(2);
    expect(await page.getByTestId("run-result").textContent()).toMatch(/^(Every check passes|A check fails)$/);
    const bending = page.locator("[data-testid=run-checks] [data-testid=check][data-name=bending]");
    expect(await bending.getByTestId("utilisation-bar").getAttribute("data-utilisation")).toBe(at9.toFixed(2));
    expect(await page.locator("[data-testid=member-diagram-svg][data-quantity=M]").count()).toBeGreaterThan(0);
    expect(await page.getByTestId("run-input").filter({ hasText: "29.5276 ft" }).count()).toBe(1);
    expect(await page.getByTestId("run-sha256").textContent()).toMatch(/^sha256:[0-9a-f]{64} \(/);

    expect(await seriousViolations(page)).toEqual([]);

    // The calc sheet as a PDF rendered on the server: every page carries the run id, the version and its hash.
    const runUrl = page.url();
    const runId = runUrl.split("/runs/")[1];
    // The run's record is sealed in the log within seconds (the worker's sealer); its page then shows the seal, which
    // checks out in this very browser, and the calc sheet prints it. Waiting for it keeps the sheet's state still below.
    const seal = await waitForSeal(page);
    await page.getByRole("button", { name: "Check it in this browser" }).click();
    await expect.poll(() => page.getByTestId("seal-check-result").textContent()).toMatch(/^Verified here/);
    await page.getByTestId("open-sheet").click();
    await page.getByTestId("calc-sheet").waitFor();
    const versionLine = (await page.getByTestId("sheet-header").locator("p").nth(3).textContent())!;
    expect(versionLine).toMatch(/ v\d+ · sha256:[0-9a-f]{12}$/);
    const unsigned = await downloadPdf(page, page.getByTestId("download-pdf"));
    expect(unsigned.pages.length).toBeGreaterThan(1);
    unsigned.pages.forEach((text, index) => {
      expect(text, `page ${index + 1}`).toContain(`Run ${runId}`);
      expect(text, `page ${index + 1}`).toContain(versionLine.slice(versionLine.lastIndexOf(" v")).trim());
      expect(text, `page ${index + 1}`).toContain(`Page ${index + 1} of ${unsigned.pages.length}`);
    });
    expect(unsigned.pages.join("\n")).toContain("Not issued: no sign-off is recorded against this run.");
    // The seal is printed: the leaf hash and the head's digest, for a check years later without the server.
    expect(unsigned.pages.join("").replace(/\s+/g, "")).toContain(seal.leafHash);
    expect(unsigned.pages.join("").replace(/\s+/g, "")).toContain(seal.digest);
    // The same state again gives the PDF kept for it, not a new one.
    expect((await downloadPdf(page, page.getByTestId("download-pdf"))).sha256).toBe(unsigned.sha256);
    await page.goto(runUrl);

    // Issue it: number a calc, then issue the run as its revision A for the demo reviewer to check.
    const calcNumber = `C-${Date.now().toString(36).slice(-4).toUpperCase()}`;
    await page.getByTestId("calc-number").fill(calcNumber);
    await page.getByTestId("calc-title").fill("Floor beam, grid 3");
    await page.getByTestId("calc-submit").click();
    await page.getByTestId("issue-form").waitFor({ timeout: 15_000 });
    const reviewer = DEMO_USERS.find((user) => user.email.startsWith("reviewer@"))!;
    await page.getByTestId("issue-checker").selectOption({ label: reviewer.name });
    await page.getByTestId("issue-submit").click();
    // The page refreshes into the sign-off: revision A, waiting for its check.
    const issued = page.locator("[data-testid=calc-revision][data-state=awaiting-check]");
    await issued.waitFor({ timeout: 15_000 });
    expect(await issued.textContent()).toContain(`${calcNumber} rev A · Floor beam, grid 3`);
    expect(await issued.textContent()).toContain(`Checker: ${reviewer.name}.`);

    // The checker checks it; the job's responsible engineer (the demo lead) approves it.
    const checker = await pageAs(await signInOverHttp(reviewer.email, reviewer.password));
    await checker.goto(runUrl);
    await checker.getByTestId("check-approve").click();
    // The page refreshes: the revision now waits for approval, and the checker's form is gone.
    await checker.locator("[data-testid=calc-revision][data-state=awaiting-approval]").waitFor({ timeout: 15_000 });
    expect(await checker.getByTestId("check-form").count()).toBe(0);
    const responsible = await pageAs(await demoSession("lead"));
    await responsible.goto(runUrl);
    await responsible.getByTestId("approve-submit").click();
    await responsible.locator("[data-testid=calc-revision][data-state=approved]").waitFor({ timeout: 15_000 });
    expect(await responsible.getByTestId("calc-revision-steps").locator("li").count()).toBe(3);

    // The calc sheet repeats the run id, the version and its hash, and carries the sign-off.
    await responsible.getByTestId("open-sheet").click();
    await responsible.getByTestId("calc-sheet").waitFor();
    expect(await responsible.getByTestId("sheet-calc").textContent()).toBe(`Calc ${calcNumber} rev A · Floor beam, grid 3`);
    expect(await responsible.getByTestId("sheet-run").textContent()).toContain(runUrl.split("/runs/")[1]);
    expect(await responsible.getByTestId("sheet-sign-off").textContent()).toContain(reviewer.name);
    expect(await responsible.getByTestId("caution").count()).toBe(2);
    // The signed sheet is a new state: a new PDF with the sign-off, and the unsigned one is still kept as it was.
    const signed = await downloadPdf(responsible, responsible.getByTestId("download-pdf"));
    expect(signed.sha256).not.toBe(unsigned.sha256);
    expect(signed.pages.join("\n")).toContain(`Calc ${calcNumber} rev A`);
    expect(signed.pages.join("\n")).toContain(reviewer.name);
    await responsible.goto(runUrl);
    const kept = responsible.getByTestId("sheet-pdf");
    expect(await kept.evaluateAll((items) => items.map((item) => item.getAttribute("data-sha256")))).toEqual([
      unsigned.sha256,
      signed.sha256,
    ]);
    expect((await downloadPdf(responsible, kept.first().locator("a"))).sha256).toBe(unsigned.sha256);

    // The job lists the run and the calc, approved.
    await page.goto(appUrl("/jobs/MF-2304"));
    expect(await page.getByTestId("run-row").count()).toBeGreaterThan(0);
    expect(await page.locator(`[data-testid=calc-row][data-number=${calcNumber}]`).textContent()).toMatch(/rev A/);
    expect(refused.filter((text) => /Content Security Policy|Refused to/.test(text))).toEqual([]);
  },
  journeyTimeout(2, 150_000),
);
