// The auditor's run log in Chromium: filtering by a job and then by failing checks changes the table and writes the
// filters into the address (so the list can be reloaded and sent on); a heading sorts it; the CSV downloaded from it
// has the export's header and one record per run the table shows.
import fs from "node:fs";
import { expect, it } from "vitest";
import { parseCsv } from "@/lib/domain/csv";
import { useBrowser, usePagesAs } from "../support/browser";
import { appUrl } from "../support/env";
import { demoEngineerJob, latestVersionId, postRun } from "../support/demo-runs";
import { demoSession } from "../support/pages";

const pageAs = usePagesAs(useBrowser());

/** A job of its own with runs of the fixed-end beam at these spans, run by the demo engineer through the API. */
async function jobWithRuns(spans: string[]): Promise<string> {
  const cookie = await demoSession("engineer");
  const job = await demoEngineerJob("LOG", "Kiln Close workshop");
  const versionId = await latestVersionId("fixed-end-beam");
  for (const L of spans) await postRun(cookie, { jobId: job.id, versionId, inputs: { L } });
  return job.jobNumber;
}

it("filters by job and by failing checks, keeps the filters in the address, sorts, and downloads what it shows", async () => {
  // Short spans pass every check; the 20 m span fails (bending and deflection grow with the span).
  const jobNumber = await jobWithRuns(["4 m", "5 m", "6 m", "20 m"]);
  await jobWithRuns(["20 m"]); // another job's failing run, which the job filter must leave out

  const page = await pageAs(await demoSession("auditor"));
  await page.goto(appUrl("/audit"));
  await page.getByTestId("audit-run-log-link").click();
  await page.waitForURL((url) => url.pathname === "/audit/runs");
  const rows = page.getByTestId("run-row");
  // The section's skeleton shows first; the table follows.
  await expect.poll(() => rows.count(), { timeout: 15_000 }).toBeGreaterThan(0);

  await page.getByTestId("run-log-filter-job").fill(jobNumber);
  await page.getByTestId("run-log-filter-submit").click();
  await page.waitForURL((url) => url.searchParams.get("job") === jobNumber);
  await expect.poll(() => rows.count(), { timeout: 15_000 }).toBe(4);
  expect(new URL(page.url()).search).toBe(`?job=${jobNumber}`);

  await page.getByTestId("run-log-filter-pass").selectOption("false");
  await page.getByTestId("run-log-filter-submit").click();
  await page.waitForURL((url) => url.searchParams.get("pass") === "false");
  await expect.poll(() => rows.count(), { timeout: 15_000 }).toBe(1);
  expect(Object.fromEntries(new URL(page.url()).searchParams)).toEqual({ job: jobNumber, pass: "false" });
  expect(await page.getByTestId("run-outcome").textContent()).toBe("A check fails");
  expect(await page.getByTestId("run-sign-off").textContent()).toBe("Not issued");

  // The address is the list: opened again, it shows the same.
  await page.reload();
  expect(await rows.count()).toBe(1);
  expect(await page.getByTestId("run-log-filter-job").inputValue()).toBe(jobNumber);
  expect(await page.getByTestId("run-log-filter-pass").inputValue()).toBe("false");

  // The download is what the table shows, with the export's header.
  const shown = await rows.evaluateAll((items) => items.map((item) => item.getAttribute("data-run-id")));
  const [download] = await Promise.all([page.waitForEvent("download"), page.getByTestId("run-log-export").click()]);
  expect(download.suggestedFilename()).toMatch(/^gusset-run-log-\d{8}T\d{6}Z\.csv$/);
  const [header, ...records] = parseCsv(fs.readFileSync((await download.path())!, "utf8"));
  expect(header.slice(0, 4)).toEqual(["run_id", "created_at", "job_number", "job_name"]);
  expect(header.at(-1)).toBe("sign_off");
  expect(records.map((record) => record[0])).toEqual(shown);
  expect(records[0].slice(2, 4)).toEqual([jobNumber, "Kiln Close workshop"]);

  // Back to the job's four runs, then largest utilisation first: the failing one leads.
  await page.getByTestId("run-log-filter-pass").selectOption("");
  await page.getByTestId("run-log-filter-submit").click();
  await expect.poll(() => rows.count(), { timeout: 15_000 }).toBe(4);
  await page.getByTestId("sort-utilisation").click();
  await page.waitForURL((url) => url.searchParams.get("sort") === "utilisation");
  await expect.poll(() => rows.first().getAttribute("data-run-id"), { timeout: 15_000 }).toBe(shown[0]);
  expect(await page.locator("th[aria-sort=descending]").textContent()).toMatch(/^Largest utilisation/);
  expect(Object.fromEntries(new URL(page.url()).searchParams)).toEqual({ job: jobNumber, sort: "utilisation" });
});
