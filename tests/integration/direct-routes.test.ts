// POST /api/runs as the served test build answers it: scripts/serve.mjs serves it itself, without Next's router
// (scripts/direct-routes.ts, bundled for the build by scripts/build-direct-routes.mjs), through the very handler
// Next would call. Over HTTP: what a person gets must be what Next would give them — the run stored and its answer,
// the refusals with their messages, the security headers — and a session only better-auth can answer (one due for its
// sliding refresh, whose new cookie better-auth sets through Next) goes to Next, which refreshes the cookie.
import http from "node:http";
import { eq } from "drizzle-orm";
import { describe, expect, it } from "vitest";
import { db } from "@/db";
import * as schema from "@/db/schema";
import { appUrl, testEnv } from "../support/env";
import { demoEngineerJob, latestVersionId } from "../support/demo-runs";
import { createTestUser, signInHeaders } from "./helpers/people";

const HOUR = 60 * 60 * 1000;
const SECURITY_HEADERS = ["content-security-policy", "x-content-type-options", "referrer-policy", "x-frame-options"];

async function engineerCookie(): Promise<{ cookie: string; userId: string }> {
  const { actor, password } = await createTestUser({ role: "engineer" });
  return { cookie: (await signInHeaders(actor.email, password)).get("cookie")!, userId: actor.id };
}

const post = (cookie: string | null, body: string, headers: Record<string, string> = {}) =>
  fetch(appUrl("/api/runs"), {
    method: "POST",
    headers: { ...(cookie ? { cookie } : {}), origin: testEnv.baseUrl, "content-type": "application/json", ...headers },
    body,
  });

async function runsOfJob(jobId: string) {
  return db.select({ id: schema.runs.id }).from(schema.runs).where(eq(schema.runs.jobId, jobId));
}

describe("POST /api/runs, served without Next's router", () => {
  it("stores the run and answers 201 with its id and Location, with the security headers every API answer has", async () => {
    const { cookie } = await engineerCookie();
    const job = await demoEngineerJob("DIRECT", "Runs served without Next's router");
    const versionId = await latestVersionId("fixed-end-beam");
    const response = await post(cookie, JSON.stringify({ jobId: job.id, versionId, inputs: { L: "6 m" } }));
    expect(response.status).toBe(201);
    const { data } = (await response.json()) as { data: { id: string; outcome: string; jobNumber: string } };
    expect(data).toMatchObject({ outcome: "succeeded", jobNumber: job.jobNumber });
    expect(response.headers.get("location")).toBe(`/api/runs/${data.id}`);
    expect((await runsOfJob(job.id)).map((run) => run.id)).toEqual([data.id]);
    // Served here, not by Next: Next's router marks each of its route handlers' answers with Vary for its own
    // client-side cache (an answer to a GET below); this answer has no such header.
    expect(response.headers.get("vary")).toBeNull();
    const byNext = await fetch(appUrl("/api/runs?limit=1"), { headers: { cookie } });
    expect(byNext.status).toBe(200);
    expect(byNext.headers.get("vary")).toContain("rsc");
    for (const name of SECURITY_HEADERS) {
      expect(response.headers.get(name), name).toBeTruthy();
      expect(response.headers.get(name), name).toBe(byNext.headers.get(name));
    }
  });

  it("refuses what it cannot run with the route's own status and message, and stores nothing", async () => {
    const { cookie } = await engineerCookie();
    const job = await demoEngineerJob("DIRECT", "Refusals served without Next's router");
    const versionId = await latestVersionId("fixed-end-beam");

    const anonymous = await post(null, JSON.stringify({ jobId: job.id, versionId, inputs: {} }));
    expect(anonymous.status).toBe(401);

    const notJson = await post(cookie, "{ not json");
    expect(notJson.status).toBe(400);
    expect(((await notJson.json()) as { error: { message: string } }).error.message).toBe("The request body is not valid JSON.");

    const wrongDimension = await post(cookie, JSON.stringify({ jobId: job.id, versionId, inputs: { L: "6 kN" } }));
    expect(wrongDimension.status).toBe(422);
    const refused = (await wrongDimension.json()) as { error: { code: string; fieldErrors: Record<string, string[]> } };
    expect(refused.error.code).toBe("invalid-input");
    expect(refused.error.fieldErrors["inputs.L"]?.[0]).toBeTruthy();

    const tooLarge = await post(cookie, JSON.stringify({ jobId: job.id, versionId, inputs: { note: "x".repeat(1024 * 1024) } }));
    expect(tooLarge.status).toBe(413);
    expect(((await tooLarge.json()) as { error: { message: string } }).error.message).toContain("larger than Gusset accepts");
    for (const name of SECURITY_HEADERS) expect(tooLarge.headers.get(name), name).toBeTruthy();

    expect(await runsOfJob(job.id)).toEqual([]);
  });

  it("hands a session due for its sliding refresh to Next, which stores the run and sends the refreshed cookie", async () => {
    const { cookie, userId } = await engineerCookie();
    const job = await demoEngineerJob("DIRECT", "A session refreshed through Next");
    const versionId = await latestVersionId("fixed-end-beam");
    // Six days of the seven gone: past better-auth's one-day update age.
    const nearEnd = new Date(Date.now() + 24 * HOUR - HOUR);
    await db.update(schema.session).set({ expiresAt: nearEnd }).where(eq(schema.session.userId, userId));

    const response = await post(cookie, JSON.stringify({ jobId: job.id, versionId, inputs: {} }));
    expect(response.status).toBe(201);
    // Next answered (its Vary), with better-auth's refreshed session cookie.
    expect(response.headers.get("vary")).toContain("rsc");
    const refreshed = response.headers.getSetCookie().find((line) => line.startsWith(cookie.slice(0, cookie.indexOf("="))));
    expect(refreshed).toMatch(/Max-Age=\d+/);
    const [session] = await db.select().from(schema.session).where(eq(schema.session.userId, userId));
    expect(session.expiresAt.getTime()).toBeGreaterThan(nearEnd.getTime() + 5 * 24 * HOUR);
    expect(await runsOfJob(job.id)).toHaveLength(1);
  });

  it("keeps a connection open for the next request after a refusal whose body it never read", async () => {
    const agent = new http.Agent({ keepAlive: true, maxSockets: 1 });
    const send = (body: string, cookie?: string) =>
      new Promise<number>((resolve, reject) => {
        const request = http.request(
          appUrl("/api/runs"),
          {
            method: "POST",
            agent,
            headers: {
              "content-type": "application/json",
              "content-length": String(Buffer.byteLength(body)),
              ...(cookie ? { cookie } : {}),
            },
          },
          (response) => {
            response.resume();
            response.on("end", () => resolve(response.statusCode ?? 0));
          },
        );
        request.on("error", reject);
        request.end(body);
      });
    const { cookie } = await engineerCookie();
    expect(await send("x".repeat(2 * 1024 * 1024))).toBe(413);
    expect(await send("{}", cookie)).toBe(422);
    agent.destroy();
  });
});
