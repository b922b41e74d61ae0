// The calc package through the real use cases and database: a calc is numbered in a job; the engineer who ran a
// run issues it as revision A with an issue status and a checker (never themselves); only the assigned checker
// checks it (approve, or return with comments); only the job's responsible engineer approves it, with a reason when
// its run fails a check; approving a later revision supersedes the earlier one. Every step is an event, and the
// database refuses to change or delete any of them.
import { describe, expect, it } from "vitest";
import { pool } from "@/db";
import type { Actor } from "@/lib/domain/actor";
import { runUseCase } from "@/lib/use-cases/run";
import { createJob } from "@/lib/use-cases/jobs";
import { createRun } from "@/lib/use-cases/runs";
import { approveRevision, checkRevision, createCalc, nextLetter, prepareRevision, readCalcPackage } from "@/lib/use-cases/calcs";
import { auditEventsFor, createTestUser } from "./helpers/people";
import { matrixJobNumber, seededVersionId } from "./helpers/action-fixtures";
import { refusal } from "./helpers/refusal";

async function team() {
  const [preparer, checker, responsible, other, auditor] = await Promise.all([
    createTestUser({ role: "engineer", label: "calc-preparer" }),
    createTestUser({ role: "engineer", label: "calc-checker" }),
    createTestUser({ role: "lead", label: "calc-responsible" }),
    createTestUser({ role: "engineer", label: "calc-other" }),
    createTestUser({ role: "auditor", label: "calc-auditor" }),
  ]);
  const people = {
    preparer: preparer.actor,
    checker: checker.actor,
    responsible: responsible.actor,
    other: other.actor,
    auditor: auditor.actor,
  };
  const jobNumber = matrixJobNumber();
  const { jobId } = await runUseCase(createJob, {
    actor: people.preparer,
    input: { jobNumber, name: "Calc package job", responsibleEngineerId: people.responsible.id },
  });
  const versionId = await seededVersionId();
  const run = async (actor: Actor, inputs: Record<string, string> = {}) =>
    (await runUseCase(createRun, { actor, input: { jobId, versionId, inputs, unitSystem: "si" } })).id;
  return { ...people, jobId, jobNumber, run };
}

describe("revision letters", () => {
  it("run A to Z, then AA, AB, …", () => {
    expect([null, "A", "B", "Y", "Z", "AA", "AZ", "BA"].map(nextLetter)).toEqual(["A", "B", "C", "Z", "AA", "AB", "BA", "BB"]);
  });
});

describe("the calc package", () => {
  it("signs a revision off in order: prepared by who ran it, checked by the assigned checker, approved by the responsible engineer", async () => {
    const t = await team();
    const { calcId } = await runUseCase(createCalc, {
      actor: t.preparer,
      input: { jobId: t.jobId, number: "C-012", title: "Roof rafter grid B" },
    });
    const again = await refusal(
      runUseCase(createCalc, { actor: t.other, input: { jobId: t.jobId, number: "c-012", title: "Again" } }),
    );
    expect(again.fieldErrors?.number).toEqual(["This job has a calc with this number; issue a new revision of it instead."]);

    const first = await t.run(t.preparer);
    const issue = (actor: Actor, runId: string, checkerId: string) =>
      runUseCase(prepareRevision, { actor, input: { calcId, runId, checkerId, issueStatus: "for-approval" } });

    expect((await refusal(issue(t.preparer, first, t.preparer.id))).fieldErrors?.checkerId).toEqual([
      "The checker is never the preparer: choose someone else.",
    ]);
    expect((await refusal(issue(t.auditor, first, t.checker.id))).code).toBe("forbidden");
    const notTheirs = await refusal(issue(t.other, first, t.checker.id));
    expect(notTheirs.message).toBe(`Only ${t.preparer.name}, who ran it, may issue this run as a revision.`);

    const a = await issue(t.preparer, first, t.checker.id);
    expect(a).toMatchObject({ calc: "C-012", letter: "A", checkerName: t.checker.name });
    // One revision at a time is signed off.
    expect((await refusal(issue(t.preparer, await t.run(t.preparer), t.checker.id))).code).toBe("conflict");

    const check = (actor: Actor, revisionId: string, decision: "approve" | "return", note?: string) =>
      runUseCase(checkRevision, { actor, input: { revisionId, decision, ...(note ? { note } : {}) } });
    expect((await refusal(check(t.responsible, a.revisionId, "approve"))).message).toBe(
      `Only the assigned checker, ${t.checker.name}, checks this revision.`,
    );
    expect((await refusal(check(t.checker, a.revisionId, "return"))).fieldErrors?.note).toEqual([
      "Say what must change before it can be checked.",
    ]);
    await check(t.checker, a.revisionId, "return", "Use the 9 m span from the latest grid.");

    // The preparer runs again and issues revision B; the checker checks it; only the responsible engineer approves.
    const second = await t.run(t.preparer, { L: "9 m" });
    const b = await issue(t.preparer, second, t.checker.id);
    expect(b.letter).toBe("B");
    const approve = (actor: Actor, revisionId: string, reason?: string) =>
      runUseCase(approveRevision, { actor, input: { revisionId, ...(reason ? { reason } : {}) } });
    expect((await refusal(approve(t.responsible, b.revisionId))).code).toBe("conflict"); // not checked yet
    await check(t.checker, b.revisionId, "approve");
    expect((await refusal(approve(t.preparer, b.revisionId))).message).toBe(
      `Only the job's responsible engineer, ${t.responsible.name}, approves its calcs.`,
    );
    await approve(t.responsible, b.revisionId);

    // Revision C of a run that fails a check needs a reason; approving it supersedes B.
    const failing = await t.run(t.preparer, { L: "20 m", w_L: "60 kN/m" });
    const c = await issue(t.preparer, failing, t.checker.id);
    await check(t.checker, c.revisionId, "approve");
    expect((await refusal(approve(t.responsible, c.revisionId))).fieldErrors?.reason).toEqual([
      "Say why it may be approved although its run fails a check.",
    ]);
    await approve(t.responsible, c.revisionId, "Deflection only; the client accepts L/250 for this plant platform.");

    const [calc] = await runUseCase(readCalcPackage, { actor: t.auditor, input: { jobId: t.jobId } });
    expect(calc.revisions.map((r) => [r.letter, r.state, r.issueStatus])).toEqual([
      ["A", "returned", "for-approval"],
      ["B", "approved", "superseded"],
      ["C", "approved", "for-approval"],
    ]);
    expect(calc.revisions[2].events.map((e) => [e.kind, e.actorName])).toEqual([
      ["prepared", t.preparer.name],
      ["checked", t.checker.name],
      ["approved", t.responsible.name],
    ]);
    const [approved] = await auditEventsFor({ action: "calcs.revision.approve", subject: `calc-revision:${c.revisionId}` });
    expect(approved.details).toEqual({
      calc: "C-012",
      letter: "C",
      reason: "Deflection only; the client accepts L/250 for this plant platform.",
    });

    for (const table of ["calcs", "calc_revisions", "calc_revision_events"]) {
      await expect(pool.query(`delete from ${table}`)).rejects.toThrow(/permission denied/);
      await expect(
        pool.query(
          `update ${table} set created_at = now()`.replace(
            "created_at",
            table === "calc_revision_events" ? "occurred_at" : "created_at",
          ),
        ),
      ).rejects.toThrow(/permission denied/);
    }
  });
});
