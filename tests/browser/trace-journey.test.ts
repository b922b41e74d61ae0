// An auditor traces a run in Chromium: from the run's page to its trace, which names the version and its author
// (the seed's first lead wrote simply-supported-beam v1), the engine and bundle, and the run's audit events; the
// trace passes axe. The auditor reproduces the run as issued — the bundle kept in S3 by its sha256, run again in a
// worker thread on the server — and sees "identical"; the reproduction joins the audit events, and at a phone's width
// nothing reaches sideways. From the version, the list of its runs holds this one. On the way, the auditor checks the
// run's inclusion proof in the verifiable log in the browser.
import { and, eq } from "drizzle-orm";
import { expect, it } from "vitest";
import { db } from "@/db";
import * as schema from "@/db/schema";
import { demoSession } from "../support/pages";
import { seriousViolations } from "../support/axe";
import { useBrowser, usePagesAs } from "../support/browser";
import { appUrl } from "../support/env";
import { demoEngineerJob, postRun } from "../support/demo-runs";
import { measureWidth, PHONE } from "../support/app-pages";

const pageAs = usePagesAs(useBrowser());

it("an auditor opens a run, goes to its trace, sees the version and its author, and reproduces it as issued", async () => {
  // The run: the demo engineer runs simply-supported-beam v1 in a job of their own, through the API.
  const job = await demoEngineerJob("TRACE", "A traced job");
  const [version] = await db
    .select({ id: schema.standardVersions.id, authorId: schema.standardVersions.authorId })
    .from(schema.standardVersions)
    .innerJoin(schema.standards, eq(schema.standards.id, schema.standardVersions.standardId))
    .where(and(eq(schema.standards.slug, "simply-supported-beam"), eq(schema.standardVersions.number, 1)));
  const [author] = await db.select({ name: schema.user.name }).from(schema.user).where(eq(schema.user.id, version.authorId));
  const run = {
    id: await postRun(await demoSession("engineer"), { jobId: job.id, versionId: version.id, inputs: { L: "6.5 m" } }),
  };

  const page = await pageAs(await demoSession("auditor"));
  await page.goto(appUrl(`/runs/${run.id}`));
  await page.getByTestId("open-trace").click();
  await page.waitForURL(new RegExp(`/runs/${run.id}/trace$`));
  expect(await page.getByTestId("trace-version-link").textContent()).toBe("Simply supported steel beam v1");
  expect(await page.getByTestId("trace-author").textContent()).toBe(author.name);
  expect(await page.getByTestId("trace-content-hash-check").getAttribute("data-matches")).toBe("yes");
  expect(await page.getByTestId("trace-diff-next").getAttribute("href")).toBe(
    "/standards/simply-supported-beam/diff?from=1&to=2",
  );
  expect(await page.getByTestId("trace-bundle").textContent()).toMatch(/^sha256:[0-9a-f]{64}$/);
  // Its seal in the verifiable log, once the worker's sealer has folded it in (every few seconds), checked here in the
  // browser's own Web Crypto: the entry names this run, its proof leads to a head signed with the log's key.
  const deadline = Date.now() + 30_000;
  while (!(await page.getByTestId("trace-integrity").getByTestId("seal-panel").isVisible())) {
    if (Date.now() > deadline) throw new Error("the run was not sealed in the log within 30 s");
    await page.waitForTimeout(1000);
    await page.reload();
  }
  expect(await page.getByTestId("seal-entry").textContent()).toContain(`"kind":"run","ref":"${run.id}"`);
  await page.getByRole("button", { name: "Check it in this browser" }).click();
  await expect.poll(() => page.getByTestId("seal-check-result").textContent()).toMatch(/^Verified here/);
  const events = page.getByTestId("trace-event");
  expect(await events.evaluateAll((rows) => rows.map((row) => row.getAttribute("data-action")))).toEqual(["runs.create"]);
  expect(await seriousViolations(page)).toEqual([]);

  await page.getByTestId("reproduce-as-issued").click();
  const verdict = page.getByTestId("reproduction-summary");
  await verdict.waitFor({ timeout: 60_000 });
  expect(await verdict.textContent()).toBe("Identical: every output came out byte for byte as recorded.");
  expect(await page.getByTestId("reproduction").getAttribute("data-identical")).toBe("yes");
  const differences = await page.getByTestId("reproduced-difference").allTextContents();
  expect(differences.length).toBeGreaterThan(3);
  expect(new Set(differences)).toEqual(new Set(["identical"]));
  // The page refreshed its audit events with the reproduction.
  await expect
    .poll(() => events.evaluateAll((rows) => rows.map((row) => row.getAttribute("data-action"))), { timeout: 15_000 })
    .toEqual(["runs.create", "runs.reproduce"]);
  expect(await seriousViolations(page)).toEqual([]);
  // At a phone's width nothing reaches sideways past the page (the tables scroll inside their own boxes).
  await page.setViewportSize(PHONE);
  const { scrollWidth, clientWidth, escaping } = await measureWidth(page);
  expect({ scrollWidth, escaping }).toEqual({ scrollWidth: clientWidth, escaping: [] });

  // From the version: every run of it, this one among them.
  await page.getByTestId("trace-version-runs").click();
  await page.waitForURL(/\/standards\/simply-supported-beam\/versions\/1\/runs$/);
  expect(await page.locator(`[data-testid=run-row][data-run-id="${run.id}"]`).count()).toBe(1);
}, 120_000);
