// A standards lead in Chromium withdraws a version, naming its successor and how the inputs map onto it (the old load
// `w` becomes `q`, and the new added load takes 30 kN/m), lands on the impact report (the job, its runs, the people
// told), starts the batch re-run and watches the progress bar, polled live, reach the end; the delta table leads with
// the checks that went from pass to fail. The report passes axe. Bending of a simply supported beam under uniform load,
// M = wL²/8 (AWC Design Aid No. 6 (2005), Fig. 1): with the added load, the 9 m spans fail where they passed.
import { expect, it } from "vitest";
import { seriousViolations } from "../support/axe";
import { useBrowser, usePagesAs } from "../support/browser";
import { appUrl } from "../support/env";
import { demoSession, journeyTimeout } from "../support/pages";
import { createTestUser } from "../integration/helpers/people";
import { jobFor, runIn, standardWithTwoVersions } from "../integration/helpers/withdrawal-fixtures";

const pageAs = usePagesAs(useBrowser());
const RUNS = 8;

it(
  "a lead withdraws a version naming its successor, reads the impact report and runs the batch to the end",
  async () => {
    const { slug, v1 } = await standardWithTwoVersions("journey");
    const [{ actor: engineer }, { actor: responsible }] = await Promise.all([
      createTestUser({ role: "engineer", label: "journey-eng" }),
      createTestUser({ role: "engineer", label: "journey-resp" }),
    ]);
    const job = await jobFor(engineer, responsible);
    for (let i = 0; i < RUNS; i++) await runIn(engineer, job.jobId, v1, { L: i % 2 === 0 ? "9 m" : "4 m" });

    const page = await pageAs(await demoSession("lead"));
    const refused: string[] = [];
    page.on("console", (message) => {
      if (message.type() === "error") refused.push(message.text());
    });
    await page.goto(appUrl(`/standards/${slug}/versions/1`));
    await page.getByTestId("withdraw-reason").fill("The load factor on w is wrong.");
    await page.getByTestId("withdraw-successor").selectOption({ label: await successorLabel() });
    await page.getByTestId("mapping-rename-w").selectOption("q");
    await page.getByTestId("mapping-value-w_add").fill("30 kN/m");
    await page.getByTestId("withdraw-submit").click();

    await page.waitForURL(/\/withdrawals\/[0-9a-f-]{36}$/, { timeout: 30_000 });
    expect(await page.getByTestId("page-title").textContent()).toMatch(/^Impact report: Withdrawal beam .* v1$/);
    expect(await page.getByTestId("impact-runs-count").textContent()).toBe(String(RUNS));
    expect(await page.locator(`[data-testid=impact-job][data-job-number="${job.jobNumber}"]`).count()).toBe(1);
    expect(
      (await page.getByTestId("impact-person").evaluateAll((rows) => rows.map((r) => r.getAttribute("data-email")))).sort(),
    ).toEqual([engineer.email, responsible.email].sort());
    expect(await page.getByTestId("impact-successor").textContent()).toMatch(/v2$/);
    expect(await seriousViolations(page)).toEqual([]);

    await page.getByTestId("batch-start").click();
    const progress = page.getByTestId("batch-progress");
    await progress.waitFor({ timeout: 30_000 });
    const bar = page.getByRole("progressbar", { name: "Batch re-run progress" });
    expect(await bar.getAttribute("aria-valuemax")).toBe(String(RUNS));
    // The bar moves without a reload: TanStack Query polls the progress until every run is done.
    await expect.poll(() => bar.getAttribute("aria-valuenow"), { timeout: 120_000, interval: 500 }).toBe(String(RUNS));
    expect(await progress.textContent()).toMatch(/complete/);
    const deltas = page.getByTestId("batch-delta");
    await expect.poll(() => deltas.count(), { timeout: 10_000 }).toBe(RUNS);
    // The 9 m spans went from pass to fail and come first.
    expect(await deltas.first().getAttribute("data-newly-failing")).toBe("1");
    expect(await deltas.last().getAttribute("data-newly-failing")).toBe("0");
    expect(await seriousViolations(page)).toEqual([]);

    // The withdrawals list, from the menu, leads back to this report.
    const report = new URL(page.url()).pathname;
    const label = (await page.getByTestId("page-title").textContent())!.replace(/^Impact report: /, "");
    await page.getByRole("navigation").getByRole("link", { name: "Withdrawals" }).click();
    await page.waitForURL(/\/withdrawals$/);
    await page
      .getByTestId("page-title")
      .filter({ hasText: /^Withdrawals$/ })
      .waitFor();
    const row = page.getByTestId("withdrawal-row").filter({ has: page.getByRole("link", { name: label, exact: true }) });
    expect(await row.count()).toBe(1);
    expect(await row.getByRole("link").getAttribute("href")).toBe(report);
    expect(await row.textContent()).toContain("Standard version");
    expect(refused.filter((text) => /Content Security Policy|Refused to/.test(text))).toEqual([]);

    async function successorLabel(): Promise<string> {
      const options = await page.getByTestId("withdraw-successor").locator("option").allTextContents();
      const label = options.find((text) => text.startsWith("v2 "));
      if (!label) throw new Error(`no v2 among ${options.join(", ")}`);
      return label;
    }
  },
  journeyTimeout(1, 240_000),
);
