// The auditor's integrity page in Chromium: the whole log checked (nothing wrong in the test database), a run's seal
// looked up by its id and checked in the browser itself (Web Crypto: SHA-256 and Ed25519, apart from the server's
// code), a proof changed on the page refused, the witness's e-mail of a head received by the fake SMTP server, and
// every head exported as NDJSON. Axe finds nothing serious.
import { eq } from "drizzle-orm";
import { expect, it } from "vitest";
import { db } from "@/db";
import * as schema from "@/db/schema";
import { seriousViolations } from "../support/axe";
import { useBrowser, usePagesAs } from "../support/browser";
import { appUrl, testEnv } from "../support/env";
import { latestVersionId, postRun } from "../support/demo-runs";
import { waitForMessage } from "../support/mailbox";
import { DEMO_BY_ROLE, demoSession } from "../support/pages";

const pageAs = usePagesAs(useBrowser());

it("checks the whole log, and a run's seal in the browser, as the auditor", async () => {
  // A run of the demo's fixed-end beam, made by the demo engineer through the API.
  const engineer = await demoSession("engineer");
  const [job] = await db.select().from(schema.jobs).where(eq(schema.jobs.jobNumber, "MF-2304"));
  const runId = await postRun(engineer, {
    jobId: job.id,
    versionId: await latestVersionId("fixed-end-beam"),
    inputs: { L: "5.5 m" },
  });

  const page = await pageAs(await demoSession("auditor"));
  await page.goto(appUrl("/audit/integrity"));
  expect(await page.getByTestId("page-title").textContent()).toBe("Integrity");
  expect(await page.getByTestId("public-key").textContent()).toMatch(
    /^-----BEGIN PUBLIC KEY-----\n[A-Za-z0-9+/=\n]+-----END PUBLIC KEY-----\n$/,
  );

  await page.getByRole("button", { name: "Run the integrity check" }).click();
  const report = page.getByTestId("integrity-report");
  await report.waitFor({ timeout: 60_000 });
  expect(await report.textContent()).toContain("Everything matches");

  // The run's seal, once the worker's sealer has folded it in (every few seconds).
  const deadline = Date.now() + 30_000;
  await page.goto(appUrl(`/audit/integrity?kind=run&ref=${runId}#record`));
  for (;;) {
    if (await page.getByTestId("seal-panel").isVisible()) break;
    // A lookup the server refused (a proof that does not verify) is a failure to report, not to wait out.
    const refused = page.getByTestId("record-lookup-error");
    if (await refused.isVisible()) throw new Error(`the run's seal was refused: ${await refused.textContent()}`);
    if (Date.now() > deadline) throw new Error("the run was not sealed within 30 s");
    await page.waitForTimeout(1000);
    // Asked again from the server (going to the same address with its #record again would only scroll).
    await page.reload();
  }
  expect(await page.getByTestId("seal-entry").textContent()).toContain(`"kind":"run","ref":"${runId}"`);
  await page.getByRole("button", { name: "Check it in this browser" }).click();
  await expect.poll(() => page.getByTestId("seal-check-result").textContent()).toMatch(/^Verified here/);
  expect(await seriousViolations(page)).toEqual([]);

  // The head that seals it went to the QA witness, with its digest.
  const digest = (await page.getByTestId("seal-head-digest").textContent())!.trim();
  const witnessed = await waitForMessage({
    to: testEnv.witnessEmail,
    subjectIncludes: digest.slice(0, 12),
    timeoutMs: 30_000,
  });
  expect(witnessed.text).toContain(`Tree head digest (SHA-256 of the head's text): ${digest}`);

  // Every head, exported: the one above among them.
  const exported = await page.evaluate(async () => (await fetch("/api/log/heads")).text());
  const heads = exported
    .trim()
    .split("\n")
    .map((line) => JSON.parse(line) as { digest: string });
  expect(heads.some((head) => head.digest === digest)).toBe(true);

  // An unknown id is answered on the page, not with an error page.
  await page.goto(appUrl("/audit/integrity?kind=run&ref=00000000-0000-4000-8000-000000000000"));
  expect(await page.getByTestId("record-lookup-error").textContent()).toContain("The log holds no run with id");
});

it("is refused to an engineer, and not offered in their navigation", async () => {
  const page = await pageAs(await demoSession("engineer"));
  const response = await page.goto(appUrl("/audit/integrity"));
  expect(response?.status()).toBe(403);
  await page.goto(appUrl("/home"));
  expect(await page.getByRole("link", { name: "Integrity" }).count()).toBe(0);
  expect(DEMO_BY_ROLE.engineer.role).toBe("engineer");
});
