// Withdrawal with its impact report: exactly the runs, calc revisions, jobs and people that used a withdrawn standard
// version or library entry; one e-mail (through the worker and the fake SMTP) to each affected run's preparer and
// each affected job's responsible engineer and nobody else; the mapping onto the successor checked against both
// versions (a message per problem, nothing stored); and the signed outcomes, append-only, whose refusals change
// nothing. Real use cases, real database, the tests' own worker.
import { describe, expect, it } from "vitest";
import { eq, sql } from "drizzle-orm";
import { db } from "@/db";
import * as schema from "@/db/schema";
import type { Actor } from "@/lib/domain/actor";
import { AppError } from "@/lib/domain/errors";
import { runUseCase } from "@/lib/use-cases/run";
import { withdrawVersion, createStandard, saveDraft, submitDraft, approveAndPublish } from "@/lib/use-cases/standards";
import { readRun, readRuns } from "@/lib/use-cases/runs";
import { checkRevision, createCalc, prepareRevision } from "@/lib/use-cases/calcs";
import { declareSuccessor, readImpactReport, recordOutcome } from "@/lib/use-cases/withdrawals";
import { startBatch } from "@/lib/use-cases/batch-reruns";
import { withdrawLibraryEntry } from "@/lib/use-cases/libraries";
import { readLibraryVersion } from "@/lib/use-cases/library-reads";
import { buildSectionOrThrow } from "@/lib/libraries";
import { expectNoChangeFrom, refusalWrites } from "../support/snapshot";
import { listMessages, waitForMessage } from "../support/mailbox";
import { createTestUser } from "./helpers/people";
import { beamSource, publishedSections } from "./helpers/library-standard";
import { jobFor, runIn, standardWithTwoVersions, uniqueLabel } from "./helpers/withdrawal-fixtures";

const person = async (role: "engineer" | "lead", label: string) => (await createTestUser({ role, label })).actor;

async function refusal(call: () => Promise<unknown>): Promise<AppError> {
  let caught: unknown = null;
  await expectNoChangeFrom(async () => {
    try {
      await call();
    } catch (error) {
      caught = error;
    }
  });
  expect(caught).toBeInstanceOf(AppError);
  return caught as unknown as AppError;
}

/** The e-mails with this subject, once `expected` have arrived, plus anything that came with them. */
async function noticesAbout(subject: string, expected: string[]) {
  for (const to of expected) await waitForMessage({ to, subjectIncludes: subject, timeoutMs: 20_000 });
  // The worker sends the queued e-mails of one transaction one after another: any stray one is due by now.
  await new Promise((resolve) => setTimeout(resolve, 1500));
  return (await listMessages()).filter((m) => m.subject.includes(subject));
}

describe("withdrawing a standard version", () => {
  it("reports exactly what used it, tells exactly those people, and keeps signed outcomes append-only", async () => {
    const { v1, v2, title } = await standardWithTwoVersions("impact");
    const [preparerA, preparerB, preparerC, responsible1, responsible2, responsible3, lead] = await Promise.all([
      person("engineer", "wd-prep-a"),
      person("engineer", "wd-prep-b"),
      person("engineer", "wd-prep-c"),
      person("engineer", "wd-resp-1"),
      person("lead", "wd-resp-2"),
      person("engineer", "wd-resp-3"),
      person("lead", "wd-lead"),
    ]);
    const job1 = await jobFor(preparerA, responsible1);
    const job2 = await jobFor(preparerB, responsible2);
    const job3 = await jobFor(preparerC, responsible3);
    // Affected: three runs of v1 in two jobs. Not affected: v2's runs (one in an affected job, one in a job of its own).
    const a1 = await runIn(preparerA, job1.jobId, v1, { L: "5 m" });
    const a2 = await runIn(preparerA, job1.jobId, v1, { w: "12 kN/m" });
    const b1 = await runIn(preparerB, job2.jobId, v1);
    const onV2 = await runIn(preparerB, job1.jobId, v2);
    const elsewhere = await runIn(preparerC, job3.jobId, v2);

    // C-001 rev A on a1, checked; C-002 rev A on b1, returned by its checker (never issued).
    const { calcId: calc1 } = await runUseCase(createCalc, {
      actor: preparerA,
      input: { jobId: job1.jobId, number: "C-001", title: "Floor beam" },
    });
    const { revisionId: issued } = await runUseCase(prepareRevision, {
      actor: preparerA,
      input: { calcId: calc1, runId: a1.id, checkerId: preparerB.id, issueStatus: "for-construction" },
    });
    await runUseCase(checkRevision, { actor: preparerB, input: { revisionId: issued, decision: "approve" } });
    const { calcId: calc2 } = await runUseCase(createCalc, {
      actor: preparerB,
      input: { jobId: job2.jobId, number: "C-002", title: "Lintel" },
    });
    const { revisionId: returned } = await runUseCase(prepareRevision, {
      actor: preparerB,
      input: { calcId: calc2, runId: b1.id, checkerId: preparerA.id, issueStatus: "for-approval" },
    });
    await runUseCase(checkRevision, { actor: preparerA, input: { revisionId: returned, decision: "return", note: "Span?" } });

    // A mapping that does not fit both versions is refused with a message per problem, and nothing is stored.
    const bad = await refusal(() =>
      runUseCase(withdrawVersion, {
        actor: lead,
        input: {
          versionId: v1,
          reason: "The load factor is wrong.",
          successorVersionId: v2,
          mapping: { rename: { w: "L" }, values: { nope: "1 m" } },
        },
      }),
    );
    expect(bad.code).toBe("invalid-input");
    expect(Object.keys(bad.fieldErrors ?? {}).sort()).toEqual([
      "mapping.rename.w",
      "mapping.values.nope",
      "mapping.values.q",
      "mapping.values.w_add",
    ]);
    expect(bad.fieldErrors?.["mapping.rename.w"]?.[0]).toMatch(/force-per-length.*length: they cannot be one input/);
    expect(bad.fieldErrors?.["mapping.values.w_add"]?.[0]).toMatch(/is new in version 2: give the value old runs take/);
    const badValue = await refusal(() =>
      runUseCase(withdrawVersion, {
        actor: lead,
        input: {
          versionId: v1,
          reason: "Wrong.",
          successorVersionId: v2,
          mapping: { rename: { w: "q" }, values: { w_add: "3 m" } },
        },
      }),
    );
    expect(badValue.fieldErrors?.["mapping.values.w_add"]?.[0]).toMatch(/Added uniform load: 3 m is .*length.*force per length/);
    const otherStandard = await standardWithTwoVersions("impact-other");
    const wrongSuccessor = await refusal(() =>
      runUseCase(withdrawVersion, {
        actor: lead,
        input: { versionId: v1, reason: "Wrong.", successorVersionId: otherStandard.v2, mapping: { rename: { w: "q" } } },
      }),
    );
    expect(wrongSuccessor.fieldErrors?.successorVersionId).toBeDefined();

    const withdrawn = await runUseCase(withdrawVersion, {
      actor: lead,
      input: {
        versionId: v1,
        reason: "The load factor is wrong.",
        successorVersionId: v2,
        mapping: { rename: { w: "q" }, values: { w_add: "0 kN/m" } },
      },
    });
    expect(withdrawn).toMatchObject({ successor: 2, notified: 4 });

    const report = await runUseCase(readImpactReport, { actor: lead, input: { id: withdrawn.withdrawalId } });
    expect(report.runs.map((r) => r.id).sort()).toEqual([a1.id, a2.id, b1.id].sort());
    expect(report.jobs.map((j) => [j.jobNumber, j.runs, j.revisions, j.open])).toEqual([
      [job1.jobNumber, 2, 1, 1],
      [job2.jobNumber, 1, 0, 0],
    ]);
    expect(report.revisions.map((r) => [r.id, r.open, r.tracked])).toEqual([
      [issued, true, true],
      [returned, false, false],
    ]);
    expect(report.people.map((p) => p.id).sort()).toEqual([preparerA.id, preparerB.id, responsible1.id, responsible2.id].sort());
    expect(report.mapping).toMatchObject({
      successorVersionId: v2,
      mapping: { rename: { w: "q" }, values: { w_add: "0 kN/m" }, drop: [] },
    });

    // Marked wherever runs appear: the run, the lists (and so GET /api/runs and /api/runs/{id}).
    const read = await runUseCase(readRun, { actor: preparerC, input: { id: a1.id } });
    expect(read.withdrawn).toBe(true);
    expect(read.withdrawals.map((w) => w.id)).toEqual([withdrawn.withdrawalId]);
    const listed = await runUseCase(readRuns, { actor: preparerC, input: { job: job1.jobNumber } });
    expect(Object.fromEntries(listed.runs.map((r) => [r.id, r.withdrawn]))).toEqual({
      [a1.id]: true,
      [a2.id]: true,
      [onV2.id]: false,
    });
    expect((await runUseCase(readRun, { actor: preparerC, input: { id: elsewhere.id } })).withdrawn).toBe(false);

    // One e-mail each to the preparers and responsible engineers, nobody else (not C, not responsible 3).
    const sent = await noticesAbout(`Withdrawn: ${title} v1`, [
      preparerA.email,
      preparerB.email,
      responsible1.email,
      responsible2.email,
    ]);
    expect(sent.map((m) => m.to.join(",")).sort()).toEqual(
      [preparerA.email, preparerB.email, responsible1.email, responsible2.email].sort(),
    );
    const toA = sent.find((m) => m.to.includes(preparerA.email))!;
    expect(toA.text).toContain(`/runs/${a1.id}`);
    expect(toA.text).toContain(`/runs/${a2.id}`);
    expect(toA.text).not.toContain(b1.id);
    expect(toA.text).toContain(`/withdrawals/${withdrawn.withdrawalId}`);
    const toR1 = sent.find((m) => m.to.includes(responsible1.email))!;
    expect(toR1.text).toContain(`${job1.jobNumber} (`);
    expect(toR1.text).not.toContain(job2.jobNumber);

    // Outcomes: refusals change nothing.
    const base = { withdrawalId: withdrawn.withdrawalId, revisionId: issued };
    const noReason = await refusal(() => runUseCase(recordOutcome, { actor: lead, input: { ...base, outcome: "no-action" } }));
    expect(noReason.fieldErrors?.reason).toEqual(["Say why no action is needed."]);
    const wrongPerson = await refusal(() =>
      runUseCase(recordOutcome, { actor: responsible3, input: { ...base, outcome: "no-action", reason: "Fine." } }),
    );
    expect(wrongPerson.code).toBe("forbidden");
    expect(wrongPerson.message).toContain(`responsible engineer of job ${job1.jobNumber}`);
    const unknown = await refusal(() =>
      runUseCase(recordOutcome, {
        actor: lead,
        input: { ...base, revisionId: crypto.randomUUID(), outcome: "no-action", reason: "Fine." },
      }),
    );
    expect(unknown.code).toBe("not-found");
    const notAffected = await refusal(() =>
      runUseCase(recordOutcome, {
        actor: lead,
        input: { ...base, outcome: "rerun-checked", newRevisionId: returned },
      }),
    );
    expect(notAffected.fieldErrors?.newRevisionId).toBeDefined();

    // The job's responsible engineer (an engineer) signs; later a lead records another: both kept, the last in force.
    await runUseCase(recordOutcome, {
      actor: responsible1,
      input: { ...base, outcome: "no-action", reason: "The 1.6 factor was not used on this job's loads." },
    });
    await runUseCase(recordOutcome, {
      actor: lead,
      input: { ...base, outcome: "drawings-revised", reference: "S-101 rev C" },
    });
    const after = await runUseCase(readImpactReport, { actor: preparerC, input: { id: withdrawn.withdrawalId } });
    const tracked = after.revisions.find((r) => r.id === issued)!;
    expect(tracked.open).toBe(false);
    expect(tracked.outcomes.map((o) => [o.kind, o.reason, o.reference])).toEqual([
      ["no-action", "The 1.6 factor was not used on this job's loads.", null],
      ["drawings-revised", null, "S-101 rev C"],
    ]);
    // Append-only for the app's role: an outcome cannot be changed or removed.
    await expect(
      db.execute(sql`update withdrawal_outcomes set reason = 'edited' where revision_id = ${issued}`),
    ).rejects.toThrow();
    await expect(db.execute(sql`delete from withdrawal_outcomes where revision_id = ${issued}`)).rejects.toThrow();
    const kept = await db.select().from(schema.withdrawalOutcomes).where(eq(schema.withdrawalOutcomes.revisionId, issued));
    expect(kept.map((o) => o.kind)).toEqual(["no-action", "drawings-revised"]);
  });
});

describe("naming the successor after the withdrawal", () => {
  it("is refused until it fits, and then lets a lead start the batch", async () => {
    const { v1, v2 } = await standardWithTwoVersions("later");
    const [lead, engineer, responsible] = await Promise.all([
      person("lead", "wd-later-lead"),
      person("engineer", "wd-later-eng"),
      person("engineer", "wd-later-resp"),
    ]);
    const job = await jobFor(engineer, responsible);
    await runIn(engineer, job.jobId, v1);
    const { withdrawalId } = await runUseCase(withdrawVersion, { actor: lead, input: { versionId: v1, reason: "Wrong." } });
    expect((await runUseCase(readImpactReport, { actor: engineer, input: { id: withdrawalId } })).mapping).toBeNull();
    const noSuccessor = await refusal(() => runUseCase(startBatch, { actor: lead, input: { withdrawalId } }));
    expect(noSuccessor.message).toMatch(/No successor was named/);

    const unmapped = await refusal(() =>
      runUseCase(declareSuccessor, { actor: lead, input: { withdrawalId, successorVersionId: v2 } }),
    );
    expect(Object.keys(unmapped.fieldErrors ?? {}).sort()).toEqual([
      "mapping.rename.w",
      "mapping.values.q",
      "mapping.values.w_add",
    ]);
    // An engineer is refused for their role: the runner's one write is the refusal's audit event.
    await expectNoChangeFrom(
      () =>
        expect(
          runUseCase(declareSuccessor, {
            actor: engineer,
            input: { withdrawalId, successorVersionId: v2, mapping: { rename: { w: "q" }, values: { w_add: "0 kN/m" } } },
          }),
        ).rejects.toMatchObject({ code: "forbidden" }),
      { except: refusalWrites("forbidden", engineer) },
    );

    await runUseCase(declareSuccessor, {
      actor: lead,
      input: { withdrawalId, successorVersionId: v2, mapping: { rename: { w: "q" }, values: { w_add: "0 kN/m" } } },
    });
    const report = await runUseCase(readImpactReport, { actor: engineer, input: { id: withdrawalId } });
    expect(report.mapping).toMatchObject({ successorVersionId: v2, mapping: { rename: { w: "q" } } });
    expect(await runUseCase(startBatch, { actor: lead, input: { withdrawalId } })).toMatchObject({ runs: 1 });
    // The worker re-runs it in the background: wait for its item, so that its rows are not written while the next
    // test compares whole tables around a refusal.
    const [batch] = await db.select().from(schema.rerunBatches).where(eq(schema.rerunBatches.withdrawalId, withdrawalId));
    const deadline = Date.now() + 60_000;
    let items = 0;
    while (items < 1 && Date.now() < deadline) {
      [{ items }] = await db
        .select({ items: sql<number>`count(*)`.mapWith(Number) })
        .from(schema.rerunBatchItems)
        .where(eq(schema.rerunBatchItems.batchId, batch.id));
      if (items < 1) await new Promise((resolve) => setTimeout(resolve, 200));
    }
    expect(items, "the batch's one re-run recorded by the worker").toBe(1);
  });
});

async function standardOnSections(author: Actor, reviewer: Actor) {
  const library = await publishedSections(author, reviewer);
  const Ix = buildSectionOrThrow({ shape: "i", d: 0.4, b: 0.18, tf: 0.012, tw: 0.008, r: 0.012 }).properties.Ix;
  const { draftId } = await runUseCase(createStandard, {
    actor: author,
    input: { slug: uniqueLabel("wd-on-library"), title: "Beam on a library section" },
  });
  await runUseCase(saveDraft, { actor: author, input: { draftId, source: beamSource(library, Ix) } });
  const { reviewId } = await runUseCase(submitDraft, { actor: author, input: { draftId, changelog: "First." } });
  const { versionId } = await runUseCase(approveAndPublish, { actor: reviewer, input: { reviewId } });
  return { library, versionId };
}

describe("withdrawing a library entry", () => {
  it("reports the runs that used the entry and no other, and tells their people", async () => {
    const [author, reviewer, engineer, other, responsible] = await Promise.all([
      person("lead", "wd-lib-author"),
      person("lead", "wd-lib-reviewer"),
      person("engineer", "wd-lib-eng"),
      person("engineer", "wd-lib-other"),
      person("engineer", "wd-lib-resp"),
    ]);
    const { library, versionId } = await standardOnSections(author, reviewer);
    const job = await jobFor(engineer, responsible);
    const on400 = await runIn(engineer, job.jobId, versionId, { beam: "TB 400" });
    const on400b = await runIn(engineer, job.jobId, versionId, { beam: "tb 400", L: "5 m" });
    const on300 = await runIn(other, job.jobId, versionId, { beam: "TB 300" });
    const libraryVersion = await runUseCase(readLibraryVersion, { actor: author, input: { slug: library, number: 1 } });

    const wrongReplacement = await refusal(() =>
      runUseCase(withdrawLibraryEntry, {
        actor: author,
        input: { versionId: libraryVersion.id, entryKey: "TB 400", reason: "Flange width mistyped.", replacementKey: "TB 999" },
      }),
    );
    expect(wrongReplacement.fieldErrors?.replacementKey).toBeDefined();

    const withdrawn = await runUseCase(withdrawLibraryEntry, {
      actor: author,
      input: { versionId: libraryVersion.id, entryKey: "TB 400", reason: "Flange width mistyped.", replacementKey: "tb 300" },
    });
    expect(withdrawn).toMatchObject({ replacement: "TB 300", notified: 2 });
    const report = await runUseCase(readImpactReport, { actor: other, input: { id: withdrawn.withdrawalId } });
    expect(report.withdrawal.label).toBe(`TB 400 in ${library} v1`);
    expect(report.runs.map((r) => r.id).sort()).toEqual([on400.id, on400b.id].sort());
    expect(report.jobs.map((j) => [j.jobNumber, j.runs])).toEqual([[job.jobNumber, 2]]);
    expect(report.people.map((p) => p.id).sort()).toEqual([engineer.id, responsible.id].sort());
    expect(report.mapping).toMatchObject({ successorVersionId: null, replacementEntryKey: "TB 300" });
    expect((await runUseCase(readRun, { actor: other, input: { id: on400.id } })).withdrawn).toBe(true);
    expect((await runUseCase(readRun, { actor: other, input: { id: on300.id } })).withdrawn).toBe(false);

    const sent = await noticesAbout(`Withdrawn: TB 400 in ${library} v1`, [engineer.email, responsible.email]);
    expect(sent.map((m) => m.to.join(",")).sort()).toEqual([engineer.email, responsible.email].sort());
  });
});
