// The served build's JSON answers: a small one goes as it is, marked no-transform (gzip's set-up and framing cost more
// than a few hundred bytes save, and Next would otherwise compress every route handler's answer); a large one is still
// compressed. Through the real server, since the compression is Next's own (lib/domain/json-response.ts).
import { beforeAll, describe, expect, it } from "vitest";
import { COMPRESS_FROM_BYTES } from "@/lib/domain/json-response";
import { appUrl } from "../support/env";
import { runUseCase } from "@/lib/use-cases/run";
import { createRun } from "@/lib/use-cases/runs";
import { createTestUser, signInHeaders, TEST_PASSWORD } from "./helpers/people";
import { matrixJob, seededVersionId } from "./helpers/action-fixtures";

let engineer: Headers;

beforeAll(async () => {
  const person = await createTestUser({ role: "engineer" });
  engineer = await signInHeaders(person.actor.email, TEST_PASSWORD);
  // Runs of its own for the large answer (the seed makes none, and this file may run first).
  const job = await matrixJob();
  const versionId = await seededVersionId();
  for (let i = 0; i < 12; i++)
    await runUseCase(createRun, {
      actor: job.engineer,
      input: { jobId: job.jobId, versionId, inputs: { L: `${5 + i / 10} m` }, unitSystem: "si" },
    });
}, 60_000);

async function get(path: string) {
  const headers = new Headers(engineer);
  headers.set("accept-encoding", "gzip, deflate, br");
  const response = await fetch(appUrl(path), { headers });
  // fetch decodes the body; the headers still say how it came.
  return { status: response.status, headers: response.headers, bytes: Buffer.byteLength(await response.text()) };
}

describe("JSON answers and compression", () => {
  it("sends a small answer uncompressed, marked no-transform", async () => {
    const me = await get("/api/me");
    expect(me.status).toBe(200);
    expect(me.bytes).toBeLessThan(COMPRESS_FROM_BYTES);
    expect(me.headers.get("content-encoding")).toBeNull();
    expect(me.headers.get("cache-control")?.split(", ")).toEqual(["no-store", "no-transform"]);
  });

  it("still compresses a large answer", async () => {
    const page = await get("/api/runs?limit=50");
    expect(page.status).toBe(200);
    // This file's own runs make a page of this size at least; the test means nothing if they did not.
    expect(page.bytes).toBeGreaterThan(4 * COMPRESS_FROM_BYTES);
    expect(page.headers.get("content-encoding")).toBe("gzip");
    expect(page.headers.get("cache-control") ?? "").not.toContain("no-transform");
  });

  it("sends a small error answer uncompressed too", async () => {
    const missing = await get("/api/runs/00000000-0000-4000-8000-000000000000");
    expect(missing.status).toBe(404);
    expect(missing.headers.get("content-encoding")).toBeNull();
    expect(missing.headers.get("cache-control")).toBe("no-transform");
  });
});
