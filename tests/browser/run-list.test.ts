// A list of runs longer than a page: the first 50 come with the page, "Older runs" fetches the next page from
// GET /api/runs in place (TanStack Query) without leaving the page, and the rows are newest first without a gap or a
// repeat across the page boundary. Then the oldest and newest runs compared side by side, and a run shown in US
// customary units, remembered across a reload, and so is the comparison (the same differences, of the SI values).
import { eq } from "drizzle-orm";
import { expect, it } from "vitest";
import { db } from "@/db";
import * as schema from "@/db/schema";
import { useBrowser, usePagesAs } from "../support/browser";
import { appUrl } from "../support/env";
import { demoEngineerJob, latestVersionId, postRun } from "../support/demo-runs";
import { demoSession } from "../support/pages";

const pageAs = usePagesAs(useBrowser());

it("loads older runs in place, newest first, with none missing or repeated", async () => {
  const cookie = await demoSession("engineer");
  const job = await demoEngineerJob("LIST", "A job with many runs");
  const jobNumber = job.jobNumber;
  const versionId = await latestVersionId("fixed-end-beam");
  // 53 runs through the API, a few at a time: more than the page's 50.
  const made: string[] = [];
  for (let k = 0; k < 53; k += 4) {
    made.push(
      ...(await Promise.all(
        Array.from({ length: Math.min(4, 53 - k) }, (_, i) =>
          postRun(cookie, { jobId: job.id, versionId, inputs: { L: `${4 + (k + i) / 10} m` } }),
        ),
      )),
    );
  }
  const newestFirst = (
    await db
      .select({ id: schema.runs.id })
      .from(schema.runs)
      .where(eq(schema.runs.jobId, job.id))
      .orderBy(schema.runs.createdAt, schema.runs.id)
  )
    .map((row) => row.id)
    .reverse();
  expect(newestFirst.toSorted()).toEqual(made.toSorted());

  const page = await pageAs(cookie);
  await page.goto(appUrl(`/runs?job=${jobNumber}`));
  const rows = page.getByTestId("run-row");
  expect(await rows.count()).toBe(50);
  await page.getByTestId("runs-next").click();
  await expect.poll(() => rows.count(), { timeout: 15_000 }).toBe(53);
  expect(new URL(page.url()).search).toBe(`?job=${jobNumber}`);
  expect(await rows.evaluateAll((items) => items.map((item) => item.getAttribute("data-run-id")))).toEqual(newestFirst);
  expect(await page.getByTestId("runs-next").count()).toBe(0);

  // The oldest and the newest side by side: the span differs, and with it the bending utilisation.
  await page.goto(appUrl(`/runs/${newestFirst.at(-1)}`));
  await page.getByTestId("compare-with").selectOption(newestFirst[0]);
  await page.getByTestId("compare-submit").click();
  await page.waitForURL(/\/runs\/compare\?a=/);
  const compareUrl = page.url();
  const span = page.locator("[data-testid=compared-inputs] [data-testid=compared-row][data-key=L]");
  expect(await span.getAttribute("data-changed")).toBe("yes");
  const spanDifference = await span.getByTestId("compared-difference").textContent();
  expect(spanDifference).toMatch(/^\+\d+(\.\d+)? %$/);
  const spanCells = () => span.locator("td").allTextContents();
  expect((await spanCells()).slice(0, 2)).toEqual([expect.stringMatching(/ m$/), expect.stringMatching(/ m$/)]);
  const bending = page.locator("[data-testid=compared-utilisations] [data-testid=compared-row][data-key=bending]");
  expect(await bending.getByTestId("compared-difference").textContent()).toMatch(/^\+\d+(\.\d+)? %$/);
  expect(
    await page.locator("[data-testid=compared-inputs] [data-testid=compared-row][data-key=E]").getAttribute("data-changed"),
  ).toBe("no");
  expect(await page.getByTestId("caution").count()).toBe(2);

  // US customary display, remembered: the reactions and diagrams switch to kip and kip·ft, and stay so on reload.
  await page.goto(appUrl(`/runs/${newestFirst[0]}`));
  const reactionHeadings = () => page.locator("[data-testid=reactions-table] th").allTextContents();
  expect(await reactionHeadings()).toContain("Ry (kN)");
  try {
    await page.getByTestId("display-units-us").click();
    await expect.poll(reactionHeadings, { timeout: 15_000 }).toContain("Ry (kip)");
    await page.reload();
    expect(await reactionHeadings()).toContain("Mz (kip·ft)");
    expect(await page.getByTestId("display-units-us").getAttribute("aria-pressed")).toBe("true");
    const moment = await page.locator("[data-testid=member-diagram-svg][data-quantity=M]").first().getAttribute("aria-label");
    expect(moment).toMatch(/kip·ft at x = \d+\.\d{2} ft/);
    // The comparison follows the same choice: the spans in feet, their difference still that of the SI values.
    await page.goto(compareUrl);
    expect(await page.getByTestId("compare-units").getAttribute("data-units")).toBe("us");
    expect((await spanCells()).slice(0, 2)).toEqual([expect.stringMatching(/ ft$/), expect.stringMatching(/ ft$/)]);
    expect(await span.getByTestId("compared-difference").textContent()).toBe(spanDifference);
    await page.goto(appUrl(`/runs/${newestFirst[0]}`));
  } finally {
    await page.getByTestId("display-units-si").click();
    await expect.poll(reactionHeadings, { timeout: 15_000 }).toContain("Ry (kN)");
  }
});
