import "server-only";
// The calc package and its sign-off, as design control works: a job's calcs are numbered (C-012); the engineer who
// ran a run issues it as the calc's next revision (A, B, …) with an issue status and names a checker, who is never
// the preparer; the checker approves it or returns it with comments; the job's responsible engineer approves a
// checked revision, giving a reason when its run fails a check or its version is no longer the current one.
// Approving a revision supersedes the calc's earlier approved revisions. Every step is an event added, never an edit.
import { AppError } from "@/lib/domain/errors";
import {
  approveRevisionSchema,
  calcRefSchema,
  checkRevisionSchema,
  createCalcSchema,
  prepareRevisionSchema,
} from "@/lib/domain/schemas/calcs";
import { runRefSchema } from "@/lib/domain/schemas/jobs";
import { getJob, listEngineers } from "@/lib/data/jobs";
import { getRun } from "@/lib/data/runs";
import { getVersion } from "@/lib/data/standards";
import {
  calcNumberTaken,
  getCalc,
  getRevision,
  insertCalc,
  insertRevision,
  insertRevisionEvent,
  lastLetter,
  listCalcs,
  lockCalc,
  revisionsOfRun,
} from "@/lib/data/calcs";
import { defineUseCase } from "./use-case";

/** A, B, … Z, AA, AB, … ZZ. */
export function nextLetter(last: string | null): string {
  if (last === null) return "A";
  if (last === "ZZ") throw new AppError("conflict", "This calc has run out of revision letters; start a new calc number.");
  const letters = last.split("");
  for (let i = letters.length - 1; i >= 0; i--) {
    if (letters[i] !== "Z") {
      letters[i] = String.fromCharCode(letters[i].charCodeAt(0) + 1);
      return letters.join("");
    }
    letters[i] = "A";
  }
  return `A${letters.join("")}`;
}

export const readCalcPackage = defineUseCase({
  name: "calcs.list",
  permission: "jobs.read",
  input: calcRefSchema,
  run: async ({ jobId }) => listCalcs(jobId),
  audit: null,
});

export const readRunSignOff = defineUseCase({
  name: "calcs.of-run",
  permission: "runs.read",
  input: runRefSchema,
  run: async ({ id }) => revisionsOfRun(id),
  audit: null,
});

export const createCalc = defineUseCase({
  name: "calcs.create",
  permission: "runs.sign-prepared",
  input: createCalcSchema,
  run: async ({ jobId, number, title }, { actor }) => {
    const job = await getJob({ id: jobId });
    if (!job) throw new AppError("not-found", "That job does not exist.");
    if (await calcNumberTaken(jobId, number))
      throw new AppError("conflict", `Job ${job.jobNumber} has a calc ${number} already.`, {
        fieldErrors: { number: ["This job has a calc with this number; issue a new revision of it instead."] },
      });
    const calc = await insertCalc({ jobId, number, title, createdById: actor.id });
    return { calcId: calc.id, jobNumber: job.jobNumber, number, title };
  },
  audit: ({ result }) => ({
    action: "calcs.create",
    subject: `calc:${result.calcId}`,
    details: { jobNumber: result.jobNumber, number: result.number, title: result.title },
  }),
});

export const prepareRevision = defineUseCase({
  name: "calcs.revision.prepare",
  permission: "runs.sign-prepared",
  input: prepareRevisionSchema,
  run: async ({ calcId, runId, checkerId, issueStatus, note }, { actor }) => {
    const calc = await getCalc(calcId);
    if (!calc) throw new AppError("not-found", "That calc does not exist.");
    const run = await getRun(runId);
    if (!run || run.jobId !== calc.jobId) throw new AppError("not-found", "That run is not a run of this calc's job.");
    if (run.createdById !== actor.id)
      throw new AppError("forbidden", `Only ${run.createdByName}, who ran it, may issue this run as a revision.`);
    if (run.outcome !== "succeeded")
      throw new AppError("conflict", "This run failed in the frame engine and has no results to issue.");
    if (checkerId === actor.id)
      throw new AppError("invalid-input", "Choose a checker other than yourself.", {
        fieldErrors: { checkerId: ["The checker is never the preparer: choose someone else."] },
      });
    const checker = (await listEngineers()).find((p) => p.id === checkerId);
    if (!checker)
      throw new AppError("invalid-input", "Choose an active engineer or lead as the checker.", {
        fieldErrors: { checkerId: ["Choose an active engineer or lead."] },
      });
    // Under the calc's lock, read its revisions again: two issues at once must not both pass this check.
    await lockCalc(calcId);
    const revisions = (await getCalc(calcId))!.revisions;
    const pending = revisions.find((r) => r.state === "awaiting-check" || r.state === "awaiting-approval");
    if (pending)
      throw new AppError(
        "conflict",
        `Revision ${pending.letter} of ${calc.number} is still being signed off; finish or return it before issuing another.`,
      );
    const letter = nextLetter(await lastLetter(calcId));
    const revision = await insertRevision({ calcId, letter, runId, preparerId: actor.id, checkerId });
    await insertRevisionEvent({ revisionId: revision.id, kind: "prepared", issueStatus, actorId: actor.id, note: note || null });
    const job = (await getJob({ id: calc.jobId }))!;
    return { revisionId: revision.id, runId, jobNumber: job.jobNumber, calc: calc.number, letter, checkerName: checker.name };
  },
  audit: ({ result }) => ({
    action: "calcs.revision.prepare",
    subject: `calc-revision:${result.revisionId}`,
    details: {
      jobNumber: result.jobNumber,
      calc: result.calc,
      letter: result.letter,
      runId: result.runId,
      checkerName: result.checkerName,
    },
  }),
});

export const checkRevision = defineUseCase({
  name: "calcs.revision.check",
  permission: "runs.sign-checked",
  input: checkRevisionSchema,
  run: async ({ revisionId, decision, note }, { actor }) => {
    const revision = await getRevision(revisionId);
    if (!revision) throw new AppError("not-found", "That revision does not exist.");
    if (revision.checkerId !== actor.id)
      throw new AppError("forbidden", `Only the assigned checker, ${revision.checkerName}, checks this revision.`);
    await lockCalc(revision.calcId);
    const now = (await getRevision(revisionId))!;
    if (now.state !== "awaiting-check")
      throw new AppError("conflict", `Revision ${now.letter} of ${now.calcNumber} is not waiting for a check.`);
    await insertRevisionEvent({
      revisionId,
      kind: decision === "approve" ? "checked" : "returned",
      actorId: actor.id,
      note: note || null,
    });
    return { revisionId, runId: now.runId, calc: now.calcNumber, letter: now.letter, decision };
  },
  audit: ({ result }) => ({
    action: "calcs.revision.check",
    subject: `calc-revision:${result.revisionId}`,
    details: { calc: result.calc, letter: result.letter, decision: result.decision },
  }),
});

export const approveRevision = defineUseCase({
  name: "calcs.revision.approve",
  permission: "runs.sign-approved",
  input: approveRevisionSchema,
  run: async ({ revisionId, reason }, { actor }) => {
    const revision = await getRevision(revisionId);
    if (!revision) throw new AppError("not-found", "That revision does not exist.");
    const job = (await getJob({ id: revision.jobId }))!;
    if (job.responsibleEngineerId !== actor.id)
      throw new AppError(
        "forbidden",
        `Only the job's responsible engineer${job.responsibleEngineerName ? `, ${job.responsibleEngineerName},` : ""} approves its calcs.`,
      );
    await lockCalc(revision.calcId);
    const now = (await getRevision(revisionId))!;
    if (now.state !== "awaiting-approval")
      throw new AppError("conflict", `Revision ${now.letter} of ${now.calcNumber} has not been checked, or is decided already.`);
    const run = (await getRun(now.runId))!;
    const version = (await getVersion({ id: run.versionId }))!;
    const needs = [
      run.pass === false ? "its run fails a check" : null,
      version.status !== "published" ? `its run is on version ${version.number}, which is ${version.status}` : null,
    ].filter((why): why is string => why !== null);
    if (needs.length > 0 && !reason)
      throw new AppError("invalid-input", `Give a reason to approve it: ${needs.join(" and ")}.`, {
        fieldErrors: { reason: [`Say why it may be approved although ${needs.join(" and ")}.`] },
      });
    await insertRevisionEvent({ revisionId, kind: "approved", actorId: actor.id, reason: reason || null });
    const calc = (await getCalc(now.calcId))!;
    for (const earlier of calc.revisions)
      if (earlier.id !== revisionId && earlier.state === "approved" && earlier.issueStatus !== "superseded")
        await insertRevisionEvent({
          revisionId: earlier.id,
          kind: "superseded",
          issueStatus: "superseded",
          actorId: actor.id,
          note: `Superseded by revision ${now.letter}.`,
        });
    return { revisionId, runId: now.runId, calc: now.calcNumber, letter: now.letter, reason: reason || null };
  },
  audit: ({ result }) => ({
    action: "calcs.revision.approve",
    subject: `calc-revision:${result.revisionId}`,
    details: { calc: result.calc, letter: result.letter, reason: result.reason },
  }),
});
