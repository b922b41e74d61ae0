// A run's trace and its reproduction, through the real use cases, database and fake S3 (issue 13, items 2 and 3).
// The demo seed has no runs, so each test runs a seeded starting standard (simply-supported-beam, published in two
// versions by the demo's two leads) in a job of its own. A run whose record says something other than what its
// version and inputs give is made by inserting a new run row with a changed record (the app's role may INSERT runs;
// no stored row is altered), in a job of its own.
import { createHash, randomUUID } from "node:crypto";
import fs from "node:fs";
import path from "node:path";
import { describe, expect, it } from "vitest";
import { and, eq } from "drizzle-orm";
import { alias } from "drizzle-orm/pg-core";
import { db } from "@/db";
import * as schema from "@/db/schema";
import type { Actor } from "@/lib/domain/actor";
import { runUseCase } from "@/lib/use-cases/run";
import { createJob } from "@/lib/use-cases/jobs";
import { createRun } from "@/lib/use-cases/runs";
import { checkRevision, createCalc, prepareRevision } from "@/lib/use-cases/calcs";
import { attachFile } from "@/lib/use-cases/files";
import { readRunTrace, readVersionRuns } from "@/lib/use-cases/trace";
import { reproduceRun } from "@/lib/use-cases/reproduce";
import { evaluationBundleKey } from "@/lib/use-cases/evaluation-bundles";
import { readRunRecord, runRecordText, type RunRecord } from "@/lib/standards/run-record";
import { getObject, putObject } from "@/lib/storage/s3";
import { expectRowsUnchanged, refusalWrites, snapshotRows } from "../support/snapshot";
import { auditEventsFor, createTestUser } from "./helpers/people";
import { refusal } from "./helpers/refusal";

const SLUG = "simply-supported-beam";
const sha256 = (bytes: Uint8Array | string) => createHash("sha256").update(bytes).digest("hex");

/** Version `number` of the seeded standard, with its author's and reviewer's names as stored. */
async function seededVersion(number: number) {
  const author = alias(schema.user, "author");
  const reviewer = alias(schema.user, "reviewer");
  const [row] = await db
    .select({
      id: schema.standardVersions.id,
      contentHash: schema.standardVersions.contentHash,
      changelog: schema.standardVersions.changelog,
      authorName: author.name,
      reviewerName: reviewer.name,
    })
    .from(schema.standardVersions)
    .innerJoin(schema.standards, eq(schema.standards.id, schema.standardVersions.standardId))
    .innerJoin(author, eq(author.id, schema.standardVersions.authorId))
    .innerJoin(reviewer, eq(reviewer.id, schema.standardVersions.reviewerId))
    .where(and(eq(schema.standards.slug, SLUG), eq(schema.standardVersions.number, number)));
  if (!row) throw new Error(`the seed's ${SLUG} v${number} is missing`);
  return row;
}

async function people() {
  const [engineer, checker, lead, auditor, admin] = await Promise.all([
    createTestUser({ role: "engineer", label: "trace-engineer" }),
    createTestUser({ role: "engineer", label: "trace-checker" }),
    createTestUser({ role: "lead", label: "trace-lead" }),
    createTestUser({ role: "auditor", label: "trace-auditor" }),
    createTestUser({ role: "admin", label: "trace-admin" }),
  ]);
  return { engineer: engineer.actor, checker: checker.actor, lead: lead.actor, auditor: auditor.actor, admin: admin.actor };
}

let counter = 0;
async function runInNewJob(engineer: Actor, responsible: Actor, versionId: string, inputs: Record<string, string>) {
  const jobNumber = `TR-${Date.now().toString(36).toUpperCase()}-${(counter++).toString(36).toUpperCase()}`;
  const { jobId } = await runUseCase(createJob, {
    actor: engineer,
    input: { jobNumber, name: "Trace job", responsibleEngineerId: responsible.id },
  });
  const run = await runUseCase(createRun, { actor: engineer, input: { jobId, versionId, inputs, unitSystem: "si" } });
  return { jobId, jobNumber, run };
}

/** A new run row beside `runId`, its record changed by `change`: a run whose record its inputs no longer give. */
async function runWithChangedRecord(runId: string, change: (record: Extract<RunRecord, { outcome: "succeeded" }>) => RunRecord) {
  const [row] = await db.select().from(schema.runs).where(eq(schema.runs.id, runId));
  const stored = readRunRecord(row.record);
  if (stored.outcome !== "succeeded") throw new Error("expected a run that succeeded");
  const id = randomUUID();
  const text = runRecordText(change({ ...stored, id }));
  await db.insert(schema.runs).values({
    ...row,
    id,
    record: text,
    recordSha256: sha256(text),
    recordBytes: Buffer.byteLength(text, "utf8"),
    createdAt: new Date(),
  });
  return id;
}

function currentBundleBytes(): { sha256: string; bytes: Buffer } {
  const folder = path.resolve("public", "evaluation");
  const manifest = JSON.parse(fs.readFileSync(path.join(folder, "manifest.json"), "utf8")) as { file: string; sha256: string };
  return { sha256: manifest.sha256, bytes: fs.readFileSync(path.join(folder, manifest.file)) };
}

describe("a run's trace", () => {
  it("names the version's author, reviewer and hash, the engine, the sign-off, the files with their sha256 and every audit event", async () => {
    const { engineer, checker, lead, auditor } = await people();
    const v1 = await seededVersion(1);
    const { jobId, jobNumber, run } = await runInNewJob(engineer, lead, v1.id, { L: "7 m" });

    const { calcId } = await runUseCase(createCalc, { actor: engineer, input: { jobId, number: "C-031", title: "Floor beam" } });
    const { revisionId } = await runUseCase(prepareRevision, {
      actor: engineer,
      input: { calcId, runId: run.id, checkerId: checker.id, issueStatus: "for-approval" },
    });
    await runUseCase(checkRevision, { actor: checker, input: { revisionId, decision: "approve" } });
    const pdf = new TextEncoder().encode(`%PDF-1.4\n% site sketch for the trace test ${randomUUID()}\n%%EOF\n`);
    await runUseCase(attachFile, {
      actor: engineer,
      input: { jobNumber, runId: run.id, note: "Site sketch", file: new File([pdf], "sketch.pdf", { type: "application/pdf" }) },
    });

    const trace = await runUseCase(readRunTrace, { actor: auditor, input: { id: run.id } });
    const record = readRunRecord(trace.run.record);
    expect(trace.version).toMatchObject({
      id: v1.id,
      number: 1,
      authorName: v1.authorName,
      reviewerName: v1.reviewerName,
      changelog: v1.changelog,
      contentHash: v1.contentHash,
      contentHashMatches: true,
      previous: null,
      next: 2,
    });
    expect(trace.version.events.map((e) => e.kind)).toContain("published");
    expect(v1.authorName).not.toBe(v1.reviewerName);
    expect(record.standard.contentHash).toBe(v1.contentHash);
    expect(record.identity).toEqual({
      engine: expect.stringMatching(/^\d+\.\d+\.\d+/),
      engineSourceHash: expect.stringMatching(/^[0-9a-f]{64}$/),
      evaluation: expect.stringMatching(/^\d+\.\d+\.\d+$/),
      bundleSha256: currentBundleBytes().sha256,
    });
    expect(trace.revisions.map((r) => [r.calcNumber, r.letter, r.state, r.events.map((e) => e.kind)])).toEqual([
      ["C-031", "A", "awaiting-approval", ["prepared", "checked"]],
    ]);
    expect(trace.attachments.map((a) => [a.fileName, a.sha256, a.bytes])).toEqual([["sketch.pdf", sha256(pdf), pdf.length]]);
    expect(trace.events.map((e) => e.action)).toEqual([
      "runs.create",
      "calcs.revision.prepare",
      "calcs.revision.check",
      "jobs.attachment.add",
    ]);
    expect(trace.events[0]).toMatchObject({ subject: `run:${run.id}`, actorId: engineer.id, details: { sha256: run.sha256 } });
    expect(trace.events[2]).toMatchObject({ subject: `calc-revision:${revisionId}`, actorId: checker.id });
    expect(trace.moreEvents).toBe(false);

    // The next version's trace: its predecessor is v1, and it has no successor.
    const v2 = await seededVersion(2);
    const second = await runInNewJob(engineer, lead, v2.id, {});
    const traced = await runUseCase(readRunTrace, { actor: engineer, input: { id: second.run.id } });
    expect(traced.version).toMatchObject({ number: 2, previous: 1, next: null, contentHashMatches: true });
    // Only those who read the audit trail see where an event came from.
    expect(traced.events.every((e) => e.ipAddress === null)).toBe(true);

    // An admin reads no runs, and so no traces.
    const { admin } = await people();
    expect((await refusal(runUseCase(readRunTrace, { actor: admin, input: { id: run.id } }))).code).toBe("forbidden");
    expect((await refusal(runUseCase(readRunTrace, { actor: auditor, input: { id: randomUUID() } }))).code).toBe("not-found");
  });

  it("lists every run of a version, newest first, a page at a time with none missing or repeated", async () => {
    const { engineer, lead, auditor } = await people();
    const v1 = await seededVersion(1);
    const made: string[] = [];
    for (const L of ["5 m", "5.5 m", "6 m"]) made.push((await runInNewJob(engineer, lead, v1.id, { L })).run.id);
    const seen: string[] = [];
    let cursor: string | undefined;
    do {
      const page = await runUseCase(readVersionRuns, { actor: auditor, input: { slug: SLUG, number: 1, cursor, limit: 2 } });
      expect(page.version).toMatchObject({ slug: SLUG, number: 1, contentHash: v1.contentHash });
      expect(page.runs.every((r) => r.versionId === v1.id)).toBe(true);
      seen.push(...page.runs.map((r) => r.id));
      cursor = page.nextCursor ?? undefined;
    } while (cursor);
    expect(new Set(seen).size).toBe(seen.length);
    // Newest first: the three made last are the first three listed.
    expect(seen.slice(0, 3)).toEqual(made.toReversed());
    const none = await refusal(runUseCase(readVersionRuns, { actor: auditor, input: { slug: SLUG, number: 999 } }));
    expect(none.code).toBe("not-found");
  });
});

describe("reproducing a run", () => {
  it("as issued: the kept bundle gives byte-identical outputs, and the reproduction is an audit event", async () => {
    const { engineer, lead, auditor } = await people();
    const v1 = await seededVersion(1);
    const { run } = await runInNewJob(engineer, lead, v1.id, { L: "8 m", w_L: "12 kN/m" });
    const record = readRunRecord((await db.select().from(schema.runs).where(eq(schema.runs.id, run.id)))[0].record);

    // The bundle that made the run is kept in S3 under its sha256, with the very bytes the server runs.
    const current = currentBundleBytes();
    const kept = await getObject({ key: evaluationBundleKey(record.identity.bundleSha256) });
    expect(kept && Buffer.from(kept.body).equals(current.bytes)).toBe(true);

    // The auditor reproduces and changes nothing but the audit trail.
    const before = await snapshotRows();
    const reproduction = await runUseCase(reproduceRun, { actor: auditor, input: { id: run.id, mode: "as-issued" } });
    await expectRowsUnchanged(before, {
      except: [
        {
          table: "audit_events",
          change: "added",
          where: (row) => row.action === "runs.reproduce" && row.subject === `run:${run.id}`,
          why: "a reproduction is recorded",
        },
      ],
    });
    expect(reproduction).toMatchObject({ runId: run.id, mode: "as-issued", bundleSha256: current.sha256 });
    expect(reproduction.comparison).toMatchObject({ identical: true, differing: 0, note: null, identity: { same: true } });
    expect(reproduction.comparison.parts).toEqual([
      { part: "evaluation", identical: true },
      { part: "analysis", identical: true },
    ]);
    expect(reproduction.comparison.outputs.length).toBeGreaterThan(3);
    expect(reproduction.comparison.outputs.every((o) => !o.changed && o.relative === 0)).toBe(true);
    const [event] = await auditEventsFor({ action: "runs.reproduce", subject: `run:${run.id}` });
    expect(event).toMatchObject({ actorId: auditor.id });
    expect(event.details).toEqual({
      runId: run.id,
      mode: "as-issued",
      bundleSha256: current.sha256,
      identical: true,
      differing: 0,
    });
    expect((await runUseCase(readRunTrace, { actor: auditor, input: { id: run.id } })).events.map((e) => e.action)).toEqual([
      "runs.create",
      "runs.reproduce",
    ]);

    // A lead may reproduce too; an engineer may not, and the refusal changes nothing but its own audit event.
    const byLead = await runUseCase(reproduceRun, { actor: lead, input: { id: run.id, mode: "current" } });
    expect(byLead.comparison.identical).toBe(true);
    const refusedBefore = await snapshotRows();
    const refused = await refusal(runUseCase(reproduceRun, { actor: engineer, input: { id: run.id, mode: "as-issued" } }));
    expect(refused.code).toBe("forbidden");
    await expectRowsUnchanged(refusedBefore, { except: refusalWrites("forbidden", engineer) });
  });

  it("as issued: a kept bundle whose bytes no longer match their sha256 is refused, and the refusal audited", async () => {
    const { engineer, lead, auditor } = await people();
    const v1 = await seededVersion(1);
    const { run } = await runInNewJob(engineer, lead, v1.id, { L: "6.5 m" });
    const { sha256: wanted, bytes } = currentBundleBytes();
    const key = evaluationBundleKey(wanted);
    // The same bundle with a line added: it would still run, but it is not the bundle that made the run.
    const tampered = Buffer.concat([bytes, Buffer.from("\nglobalThis.altered = true;\n", "utf8")]);
    expect(sha256(tampered)).not.toBe(wanted);
    await putObject({ key, body: tampered, contentType: "text/javascript" });
    try {
      const refused = await refusal(runUseCase(reproduceRun, { actor: auditor, input: { id: run.id, mode: "as-issued" } }));
      expect(refused.code).toBe("conflict");
      expect(refused.message).toBe(
        `The evaluation bundle kept under sha256 ${wanted.slice(0, 12)}… no longer has those bytes (they hash to ${sha256(tampered).slice(0, 12)}…): ` +
          "it was altered in file storage, so the run was not evaluated with it. Tell the firm's admin; the run's record itself is unchanged.",
      );
      const [event] = await auditEventsFor({ action: "runs.reproduce.refused", subject: `run:${run.id}` });
      expect(event.details).toEqual({
        runId: run.id,
        mode: "as-issued",
        bundleSha256: wanted,
        reason: "the stored bundle's bytes do not match its sha256",
      });
      expect(await auditEventsFor({ action: "runs.reproduce", subject: `run:${run.id}` })).toEqual([]);
    } finally {
      await putObject({ key, body: bytes, contentType: "text/javascript" });
    }
    const again = await runUseCase(reproduceRun, { actor: auditor, input: { id: run.id, mode: "as-issued" } });
    expect(again.comparison.identical).toBe(true);
  });

  it("as issued: a run whose bundle was never kept is refused, saying to reproduce it with today's bundle", async () => {
    const { engineer, lead, auditor } = await people();
    const v1 = await seededVersion(1);
    const { run } = await runInNewJob(engineer, lead, v1.id, {});
    const unknown = sha256(`a release never kept ${randomUUID()}`);
    const id = await runWithChangedRecord(run.id, (record) => ({
      ...record,
      identity: { ...record.identity, bundleSha256: unknown },
    }));
    const refused = await refusal(runUseCase(reproduceRun, { actor: auditor, input: { id, mode: "as-issued" } }));
    expect(refused.code).toBe("conflict");
    expect(refused.message).toMatch(
      /^The evaluation bundle that made this run \(sha256 [0-9a-f]{12}…\) is not kept in file storage/,
    );
    expect(refused.message).toMatch(/reproduce it with today's bundle instead\.$/);
    expect((await auditEventsFor({ action: "runs.reproduce.refused", subject: `run:${id}` }))[0].details).toMatchObject({
      reason: "the bundle is not kept",
      bundleSha256: unknown,
    });
    // With today's bundle it reproduces: the record's outputs are what the version and inputs give.
    const current = await runUseCase(reproduceRun, { actor: auditor, input: { id, mode: "current" } });
    expect(current.comparison).toMatchObject({ differing: 0, parts: [{ identical: true }, { identical: true }] });
  });

  it("with today's bundle: each output identical or with its relative difference from the record", async () => {
    const { engineer, lead, auditor } = await people();
    const v1 = await seededVersion(1);
    const { run } = await runInNewJob(engineer, lead, v1.id, { L: "7.5 m" });
    // A record that says one extract and one check's utilisation were 3 % and 5 % higher than its inputs give.
    let changedExtract = "";
    let changedCheck = "";
    const id = await runWithChangedRecord(run.id, (record) => {
      const [extract, value] = Object.entries(record.evaluation.extracts).find(([, v]) => v.si !== 0)!;
      const [check, result] = Object.entries(record.evaluation.checks)[0];
      changedExtract = extract;
      changedCheck = check;
      return {
        ...record,
        evaluation: {
          ...record.evaluation,
          extracts: { ...record.evaluation.extracts, [extract]: { ...value, si: value.si * 1.03 } },
          checks: { ...record.evaluation.checks, [check]: { ...result, utilisation: result.utilisation * 1.05 } },
        },
      };
    });
    const reproduction = await runUseCase(reproduceRun, { actor: auditor, input: { id, mode: "current" } });
    const { comparison } = reproduction;
    expect(comparison.identical).toBe(false);
    expect(comparison.differing).toBe(2);
    expect(comparison.parts).toEqual([
      { part: "evaluation", identical: false },
      { part: "analysis", identical: true },
    ]);
    const changed = comparison.outputs.filter((o) => o.changed);
    expect(changed.map((o) => [o.group, o.key])).toEqual([
      ["extract", changedExtract],
      ["utilisation", changedCheck],
    ]);
    // (reproduced − recorded) / |recorded|, with recorded = 1.03 × and 1.05 × what the inputs give.
    expect(changed[0].relative! / (1 / 1.03 - 1)).toBeCloseTo(1, 9);
    expect(changed[1].relative! / (1 / 1.05 - 1)).toBeCloseTo(1, 9);
    expect(comparison.outputs.filter((o) => !o.changed).every((o) => o.relative === 0)).toBe(true);
    const [event] = await auditEventsFor({ action: "runs.reproduce", subject: `run:${id}` });
    expect(event.details).toEqual({
      runId: id,
      mode: "current",
      bundleSha256: currentBundleBytes().sha256,
      identical: false,
      differing: 2,
    });
  });
});
