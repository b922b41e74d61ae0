// Jobs and runs through the real use cases and database: a job is created and changed with its audit events; a run
// of a published standard is stored as its canonical record with its sha256, and evaluating the record's version
// and inputs again gives byte-identical outputs; bad inputs, a closed job, a withdrawn version and an auditor are
// refused with nothing stored; a model the engine cannot analyse is stored as a failed run naming the free node and
// direction; runs are append-only for the app's role.
import { createHash } from "node:crypto";
import { describe, expect, it } from "vitest";
import { stringify } from "yaml";
import canonicalize from "canonicalize";
import { eq } from "drizzle-orm";
import { db, pool } from "@/db";
import * as schema from "@/db/schema";
import type { Actor } from "@/lib/domain/actor";
import { runUseCase } from "@/lib/use-cases/run";
import { approveAndPublish, createStandard, saveDraft, submitDraft, withdrawVersion } from "@/lib/use-cases/standards";
import { createJob, readJob, updateJob } from "@/lib/use-cases/jobs";
import { createRun, readRun, readRuns } from "@/lib/use-cases/runs";
import { readRunForm } from "@/lib/use-cases/run-form";
import { approveAndPublishLibrary, createLibrary, saveLibraryDraft, submitLibraryDraft } from "@/lib/use-cases/libraries";
import { buildSectionOrThrow } from "@/lib/libraries";
import { runStandardTask } from "@/lib/evaluation/tasks";
import { readRunRecord } from "@/lib/standards/run-record";
import { snapshotRows, expectRowsUnchanged } from "../support/snapshot";
import { auditEventsFor, createTestUser } from "./helpers/people";
import { refusal } from "./helpers/refusal";

let counter = 0;
const unique = (label: string) => `${label}-${Date.now().toString(36)}-${(counter++).toString(36)}`;
const jobNumber = () => `T-${Date.now().toString(36).toUpperCase()}-${(counter++).toString(36).toUpperCase()}`;

/**
 * A simply supported beam of span 2L made of two members A–B–C, on a pin and a roller, under a uniform load. With
 * `hinges: 1` both members are pinned at B, which leaves B free to move in y: a mechanism the engine must name. (A count, not a choice: a draft is
 * refused when any alternative of a choice gives a model the engine cannot analyse.)
 */
function twoSpanSource(): string {
  const member = (id: string, start: string, end: string, extra: object) => ({
    id,
    start,
    end,
    E: "200 GPa",
    A: "0.01 m^2",
    I: "1e-4 m^4",
    group: "beams",
    ...extra,
  });
  const definition = {
    title: "A two-member beam for the run tests",
    category: "beams",
    summary: "A test beam.",
    scope: "Tests only.",
    inputs: {
      L: { label: "Each span", quantity: "length", unit: "m", default: "4 m", min: "1 m", max: "20 m" },
      w: { label: "Load", quantity: "force-per-length", unit: "kN/m", default: "10 kN/m", min: "0 kN/m", max: "100 kN/m" },
      hinges: { label: "Hinges at B", quantity: "count", default: 0, min: "0", max: "1" },
    },
    model: {
      nodes: [
        { id: "A", x: "0 m", y: "0 m", support: "pinned" },
        { id: "B", x: "L", y: "0 m" },
        { id: "C", x: "2 * L", y: "0 m", support: "roller-x" },
      ],
      members: [
        member("ab", "A", "B", { when: "hinges == 0" }),
        member("bc", "B", "C", { when: "hinges == 0" }),
        member("ab", "A", "B", { when: "hinges == 1", releases: { end: true } }),
        member("bc", "B", "C", { when: "hinges == 1", releases: { start: true } }),
      ],
      load_cases: [
        {
          id: "W",
          loads: [
            { member: "ab", direction: "global-y", w: "-w" },
            { member: "bc", direction: "global-y", w: "-w" },
          ],
        },
      ],
    },
    extracts: { R_A: { reaction: { node: "A", component: "fy" }, under: "W", unit: "kN" } },
    checks: {
      reaction: {
        label: "End reaction",
        clause: "test only",
        demand: "R_A",
        relation: "<=",
        capacity: "50 kN",
        fails: "Too much.",
        unit: "kN",
      },
    },
    verification: [
      {
        name: "End reaction of a simply supported beam",
        inputs: {},
        // Simply supported span 2L under uniform load: each reaction is w(2L)/2 = wL.
        expect: { R_A: { value: "10 kN/m * 4 m", tolerance: 1e-9 } },
        source: "Statics of a simply supported beam under uniform load, R = wl/2 (common practice)",
      },
    ],
  };
  return `---\n${stringify(definition)}---\n# Two members\n\nA test standard.\n`;
}

async function publish(source: string, author: Actor, reviewer: Actor) {
  const slug = unique("run-test");
  const { draftId } = await runUseCase(createStandard, { actor: author, input: { slug, title: "Run test" } });
  const saved = await runUseCase(saveDraft, { actor: author, input: { draftId, source } });
  expect(saved.check.problems).toEqual([]);
  const { reviewId } = await runUseCase(submitDraft, { actor: author, input: { draftId, changelog: "First." } });
  const { versionId } = await runUseCase(approveAndPublish, { actor: reviewer, input: { reviewId } });
  return { slug, versionId };
}

async function people() {
  const [lead, reviewer, engineer, auditor] = await Promise.all([
    createTestUser({ role: "lead", label: "runs-lead" }),
    createTestUser({ role: "lead", label: "runs-reviewer" }),
    createTestUser({ role: "engineer", label: "runs-engineer" }),
    createTestUser({ role: "auditor", label: "runs-auditor" }),
  ]);
  return { lead: lead.actor, reviewer: reviewer.actor, engineer: engineer.actor, auditor: auditor.actor };
}

async function newJob(actor: Actor, responsible: Actor) {
  const number = jobNumber();
  const job = await runUseCase(createJob, {
    actor,
    input: { jobNumber: number, name: "Test job", client: "Test client", site: "", responsibleEngineerId: responsible.id },
  });
  return { ...job, number };
}

describe("jobs", () => {
  it("are created with a unique number and a responsible engineer, and every change is audited", async () => {
    const { lead, engineer, auditor } = await people();
    const job = await newJob(engineer, lead);
    const read = await runUseCase(readJob, { actor: auditor, input: { jobNumber: job.number } });
    expect(read).toMatchObject({
      jobNumber: job.number,
      name: "Test job",
      client: "Test client",
      site: null,
      status: "active",
      responsibleEngineerId: lead.id,
      responsibleEngineerName: lead.name,
      createdByName: engineer.name,
      runCount: 0,
    });
    const [created] = await auditEventsFor({ action: "jobs.create", subject: `job:${job.jobId}` });
    expect(created.details).toEqual({ jobNumber: job.number, name: "Test job" });

    // The same number in other letters is the same job number.
    const duplicate = await refusal(
      runUseCase(createJob, {
        actor: engineer,
        input: { jobNumber: job.number.toLowerCase(), name: "Again", responsibleEngineerId: lead.id },
      }),
    );
    expect(duplicate.code).toBe("conflict");
    expect(duplicate.fieldErrors?.jobNumber).toEqual(["Another job has this number; job numbers are unique in the firm."]);

    // An auditor cannot be a job's responsible engineer.
    const wrongPerson = await refusal(
      runUseCase(createJob, { actor: engineer, input: { jobNumber: jobNumber(), name: "X", responsibleEngineerId: auditor.id } }),
    );
    expect(wrongPerson.fieldErrors?.responsibleEngineerId).toEqual([
      "Choose an active engineer or lead: they approve the job's calcs.",
    ]);

    await runUseCase(updateJob, {
      actor: engineer,
      input: {
        jobId: job.jobId,
        jobNumber: job.number,
        name: "Test job",
        client: "Test client",
        site: "North yard",
        responsibleEngineerId: lead.id,
        status: "on-hold",
      },
    });
    const [changed] = await auditEventsFor({ action: "jobs.update", subject: `job:${job.jobId}` });
    expect(changed.details).toEqual({
      jobNumber: job.number,
      changes: { site: [null, "North yard"], status: ["active", "on-hold"] },
    });

    const refused = await refusal(
      runUseCase(createJob, { actor: auditor, input: { jobNumber: jobNumber(), name: "X", responsibleEngineerId: lead.id } }),
    );
    expect(refused.code).toBe("forbidden");
  });
});

describe("runs", () => {
  it("store the canonical record and its sha256, and the record's version and inputs evaluate again to the same bytes", async () => {
    const { lead, reviewer, engineer } = await people();
    const source = twoSpanSource();
    const { slug, versionId } = await publish(source, lead, reviewer);
    const job = await newJob(engineer, lead);

    const inputs = { L: "13.12336 ft", w: "12 kN/m" };
    const run = await runUseCase(createRun, {
      actor: engineer,
      input: { jobId: job.jobId, versionId, inputs, unitSystem: "si" },
    });
    expect(run).toMatchObject({ outcome: "succeeded", pass: true, jobNumber: job.number, slug, number: 1 });

    const [row] = await db.select().from(schema.runs).where(eq(schema.runs.id, run.id));
    expect(row.recordSha256).toBe(createHash("sha256").update(row.record, "utf8").digest("hex"));
    expect(row.recordSha256).toBe(run.sha256);
    expect(row.recordBytes).toBe(Buffer.byteLength(row.record, "utf8"));
    // Canonical (RFC 8785): writing the parsed record canonically again gives the same text.
    expect(canonicalize(JSON.parse(row.record))).toBe(row.record);

    const record = readRunRecord(row.record);
    if (record.outcome !== "succeeded") throw new Error("expected a result");
    expect(record).toMatchObject({
      id: run.id,
      job: { id: job.jobId, number: job.number },
      standard: { slug, versionId, number: 1 },
      createdBy: { id: engineer.id, name: engineer.name },
      typed: inputs,
      unitSystem: "si",
      purpose: "design",
      parentRunId: null,
      libraries: [],
    });
    // 13.12336 ft = 4.0000001 m (1 ft = 0.3048 m exactly); a simply supported span 2L under uniform load has end
    // reactions wL (common practice).
    const L = 13.12336 * 0.3048;
    expect(record.evaluation.extracts.R_A.si / (12e3 * L)).toBeCloseTo(1, 9);
    expect(row.maxUtilisation! / ((12e3 * L) / 50e3)).toBeCloseTo(1, 9);
    expect(record.identity.bundleSha256).toMatch(/^[0-9a-f]{64}$/);

    // Reproduce: the same version's source and the inputs as typed, evaluated again, give the stored bytes.
    const again = runStandardTask(source, inputs, {});
    if (!again.ok) throw new Error("the source no longer compiles");
    expect(again.evaluationJson).toBe(canonicalize(record.evaluation));
    expect(again.analysisJson).toBe(canonicalize(record.analysis));

    // Written by the statement that stored the run, with who ran it.
    const [event] = await auditEventsFor({ action: "runs.create", subject: `run:${run.id}` });
    expect([event.actorId, event.actorEmail]).toEqual([engineer.id, engineer.email]);
    expect(event.details).toEqual({
      jobNumber: job.number,
      slug,
      number: 1,
      outcome: "succeeded",
      pass: true,
      sha256: run.sha256,
      purpose: "design",
    });

    const read = await runUseCase(readRun, { actor: engineer, input: { id: run.id } });
    expect(read.record).toBe(row.record);
    const page = await runUseCase(readRuns, { actor: engineer, input: { job: job.number } });
    expect(page.runs.map((r) => r.id)).toEqual([run.id]);
    expect(page.nextCursor).toBeNull();
  });

  it("store a model the engine cannot analyse as a failed run that names the free node and direction", async () => {
    const { lead, reviewer, engineer } = await people();
    const { versionId } = await publish(twoSpanSource(), lead, reviewer);
    const job = await newJob(engineer, lead);
    const run = await runUseCase(createRun, {
      actor: engineer,
      input: { jobId: job.jobId, versionId, inputs: { hinges: "1" }, unitSystem: "si" },
    });
    expect(run.outcome).toBe("failed");
    expect(run.pass).toBeNull();
    expect(run.message).toBe(
      "The frame engine could not analyse the model: Node B is free to move in y (mechanism or missing support)",
    );
    const [row] = await db.select().from(schema.runs).where(eq(schema.runs.id, run.id));
    const record = readRunRecord(row.record);
    if (record.outcome !== "failed") throw new Error("expected a failure");
    expect(record.failure.stage).toBe("engine");
    expect(record.failure.details[0]).toMatchObject({ kind: "unstable", node: "B", direction: "uy" });
    expect(row.maxUtilisation).toBeNull();
  });

  it("refuse bad inputs with a message per input, a closed job, a withdrawn version and an auditor, storing nothing", async () => {
    const { lead, reviewer, engineer, auditor } = await people();
    const { versionId } = await publish(twoSpanSource(), lead, reviewer);
    const job = await newJob(engineer, lead);
    const attempt = (actor: Actor, input: Record<string, unknown>) =>
      refusal(runUseCase(createRun, { actor, input: { jobId: job.jobId, versionId, unitSystem: "si", ...input } }));

    const before = await snapshotRows();
    const wrong = await attempt(engineer, { inputs: { L: "6 kN", w: "" } });
    expect(wrong.code).toBe("invalid-input");
    expect(Object.keys(wrong.fieldErrors ?? {}).sort()).toEqual(["inputs.L", "inputs.w"]);
    expect(wrong.fieldErrors?.["inputs.L"]?.[0]).toMatch(/^Each span: /);

    const bounds = await attempt(engineer, { inputs: { L: "30 m" } });
    expect(bounds.fieldErrors?.["inputs.L"]?.[0]).toMatch(/^Each span: /);
    const unknown = await attempt(engineer, { inputs: { span: "4 m" } });
    expect(unknown.fieldErrors).toEqual({ "inputs.span": ["There is no input “span” in this standard."] });
    const notNumber = await attempt(engineer, { inputs: { w: "ten" } });
    expect(notNumber.fieldErrors?.["inputs.w"]?.[0]).toMatch(/^Load: /);
    expect((await attempt(auditor, { inputs: {} })).code).toBe("forbidden");
    // The version and its job are read in one query: each missing one is named, the job first when both are.
    const noVersion = await attempt(engineer, { versionId: crypto.randomUUID(), inputs: {} });
    expect([noVersion.code, noVersion.fieldErrors]).toEqual(["not-found", { versionId: ["Choose a published version."] }]);
    const noJob = await attempt(engineer, { jobId: crypto.randomUUID(), inputs: {} });
    expect([noJob.code, noJob.message, noJob.fieldErrors]).toEqual([
      "not-found",
      "That job does not exist.",
      { jobId: ["Choose a job of the firm."] },
    ]);
    const neither = await attempt(engineer, { jobId: crypto.randomUUID(), versionId: crypto.randomUUID(), inputs: {} });
    expect([neither.code, neither.fieldErrors]).toEqual(["not-found", { jobId: ["Choose a job of the firm."] }]);
    await expectRowsUnchanged(before, {
      except: [
        {
          table: "audit_events",
          change: "added",
          where: (row) => row.action === "access.refused",
          why: "the auditor's refusal is audited",
        },
      ],
    });

    await runUseCase(updateJob, {
      actor: lead,
      input: { jobId: job.jobId, jobNumber: job.number, name: "Test job", responsibleEngineerId: lead.id, status: "closed" },
    });
    const closed = await attempt(engineer, { inputs: {} });
    expect(closed.code).toBe("conflict");
    expect(closed.message).toBe(`Job ${job.number} is closed: it takes no new design runs. Reopen it to run in it.`);

    const open = await newJob(engineer, lead);
    await runUseCase(withdrawVersion, { actor: reviewer, input: { versionId, reason: "Wrong load factor." } });
    const withdrawn = await refusal(
      runUseCase(createRun, { actor: engineer, input: { jobId: open.jobId, versionId, inputs: {}, unitSystem: "si" } }),
    );
    expect(withdrawn.code).toBe("conflict");
    expect(withdrawn.message).toMatch(/is withdrawn and cannot be run/);
    const stored = await db.select().from(schema.runs).where(eq(schema.runs.versionId, versionId));
    expect(stored).toEqual([]);
  });

  it("refuse a run whose job was closed or renumbered, or whose version was withdrawn, while it was evaluated, and write none of it", async () => {
    const { lead, reviewer, engineer } = await people();
    const { versionId } = await publish(twoSpanSource(), lead, reviewer);
    // createRun with something done between its evaluation (prepare) and the statement that stores it (run).
    const meanwhile = (change: () => Promise<unknown>) =>
      ({
        ...createRun,
        prepare: async (input: Parameters<NonNullable<typeof createRun.prepare>>[0], context: { actor: Actor }) => {
          const prepared = await createRun.prepare!(input, context);
          ids.push(prepared.row.id);
          await change();
          return prepared;
        },
      }) as typeof createRun;
    const ids: string[] = [];
    const attempt = (useCase: typeof createRun, jobId: string) =>
      refusal(runUseCase(useCase, { actor: engineer, input: { jobId, versionId, inputs: {}, unitSystem: "si" } }));
    const renumber = (job: Awaited<ReturnType<typeof newJob>>, to: string) =>
      runUseCase(updateJob, {
        actor: lead,
        input: { jobId: job.jobId, jobNumber: to, name: "Test job", responsibleEngineerId: lead.id, status: "active" },
      });

    // Closed by someone who holds the job's row until after the run's statement has asked for it: the statement waits
    // for the lock, then reads the job as committed.
    const closing = await newJob(engineer, lead);
    const holder = await pool.connect();
    let committed: Promise<unknown> = Promise.resolve();
    try {
      const closed = await attempt(
        meanwhile(async () => {
          await holder.query("begin");
          await holder.query("update jobs set status = 'closed' where id = $1", [closing.jobId]);
          committed = new Promise((resolve) => setTimeout(resolve, 300)).then(() => holder.query("commit"));
        }),
        closing.jobId,
      );
      await committed;
      expect([closed.code, closed.message]).toEqual([
        "conflict",
        `Job ${closing.number} was closed while the run was evaluated.`,
      ]);
    } finally {
      holder.release();
    }

    const renumbered = await newJob(engineer, lead);
    const newNumber = jobNumber();
    const moved = await attempt(
      meanwhile(() => renumber(renumbered, newNumber)),
      renumbered.jobId,
    );
    expect([moved.code, moved.message]).toEqual([
      "conflict",
      `Job ${renumbered.number} was renumbered ${newNumber} while the run was evaluated. Run it again to record it under its new number.`,
    ]);

    const open = await newJob(engineer, lead);
    const withdrawn = await attempt(
      meanwhile(() => runUseCase(withdrawVersion, { actor: reviewer, input: { versionId, reason: "Wrong load factor." } })),
      open.jobId,
    );
    expect(withdrawn.code).toBe("conflict");
    expect(withdrawn.message).toMatch(
      /^Version 1 of A two-member beam for the run tests was withdrawn while the run was evaluated\.$/,
    );

    // Nothing of the three runs was written: no row, no library entry, no audit event.
    expect(ids).toHaveLength(3);
    const { rows } = await pool.query(
      `select (select count(*) from runs where id = any($1::uuid[]))::int as runs,
              (select count(*) from run_library_entries where run_id = any($1::uuid[]))::int as entries,
              (select count(*) from audit_events where subject = any($2::text[]))::int as events`,
      [ids, ids.map((id) => `run:${id}`)],
    );
    expect(rows).toEqual([{ runs: 0, entries: 0, events: 0 }]);
  });

  it("are append-only for the app's role: UPDATE and DELETE are refused", async () => {
    const { lead, reviewer, engineer } = await people();
    const { versionId } = await publish(twoSpanSource(), lead, reviewer);
    const job = await newJob(engineer, lead);
    const run = await runUseCase(createRun, {
      actor: engineer,
      input: { jobId: job.jobId, versionId, inputs: {}, unitSystem: "si" },
    });
    await expect(pool.query("update runs set pass = false where id = $1", [run.id])).rejects.toThrow(/permission denied/);
    await expect(pool.query("delete from runs where id = $1", [run.id])).rejects.toThrow(/permission denied/);
    await expect(pool.query("delete from run_library_entries")).rejects.toThrow(/permission denied/);
    const [row] = await db.select().from(schema.runs).where(eq(schema.runs.id, run.id));
    expect(row.pass).toBe(true);
  });

  it("offer a form with the units a person may type, filled from an earlier run when re-running it", async () => {
    const { lead, reviewer, engineer } = await people();
    const { slug, versionId } = await publish(twoSpanSource(), lead, reviewer);
    const job = await newJob(engineer, lead);
    const first = await runUseCase(createRun, {
      actor: engineer,
      input: { jobId: job.jobId, versionId, inputs: { w: "0.5 kip/ft" }, unitSystem: "us" },
    });
    const form = await runUseCase(readRunForm, { actor: engineer, input: { jobNumber: job.number, slug, from: first.id } });
    expect(form.version).toMatchObject({ id: versionId, number: 1 });
    expect(form.from).toEqual({ id: first.id, unitSystem: "us" });
    const w = form.fields.find((f) => f.key === "w");
    if (w?.kind !== "number") throw new Error("w is a number field");
    expect(w.initial).toBe("0.5 kip/ft");
    // 1 kip/ft = 4448.2216152605 N / 0.3048 m = 14.593902937 kN/m (NIST SP 811, 2008, Appendix B.8: 1 lbf = 4.4482216152605 N, 1 ft = 0.3048 m).
    expect(w.units["kip/ft"]).toBeCloseTo(14.593902937206, 9);
    expect(w.units["kN/m"]).toBe(1);
    const L = form.fields.find((f) => f.key === "L");
    expect(L).toMatchObject({ kind: "number", initial: "4 m", unit: "m", min: "1 m", max: "20 m" });
    expect(form.fields.find((f) => f.key === "hinges")).toMatchObject({ kind: "number", initial: "0", min: "0", max: "1" });

    const rerun = await runUseCase(createRun, {
      actor: engineer,
      input: { jobId: job.jobId, versionId, inputs: { w: "0.6 kip/ft" }, unitSystem: "us", parentRunId: first.id },
    });
    expect(readRunRecord((await runUseCase(readRun, { actor: engineer, input: { id: rerun.id } })).record).parentRunId).toBe(
      first.id,
    );
  });

  it("on a standard that takes a library section, store the entry used with its hash, and offer the library's sections", async () => {
    const { lead, reviewer, engineer } = await people();
    // A sections library of two invented I sections, published by two leads.
    const library = unique("beams");
    const I = (key: string, d: number) => ({
      key,
      origin: { from: "builder" },
      shape: "i",
      dimensions: { d, b: 0.15, tf: 0.012, tw: 0.008, r: 0.012 },
    });
    const { draftId } = await runUseCase(createLibrary, {
      actor: lead,
      input: { slug: library, kind: "sections", title: "Beams" },
    });
    await runUseCase(saveLibraryDraft, {
      actor: lead,
      input: { draftId, document: { kind: "sections", title: "Beams", entries: [I("TB 300", 0.3), I("TB 400", 0.4)] } },
    });
    const { reviewId } = await runUseCase(submitLibraryDraft, { actor: lead, input: { draftId, changelog: "First." } });
    await runUseCase(approveAndPublishLibrary, { actor: reviewer, input: { reviewId } });
    const Ix = buildSectionOrThrow({ shape: "i", d: 0.4, b: 0.15, tf: 0.012, tw: 0.008, r: 0.012 }).properties.Ix;

    const definition = {
      title: "Beam on a library section",
      category: "beams",
      summary: "A test beam.",
      scope: "Tests only.",
      inputs: {
        L: { label: "Span", quantity: "length", unit: "m", default: "6 m" },
        beam: { label: "Beam section", quantity: "section", library, shapes: ["i"], default: "TB 300" },
      },
      model: {
        nodes: [
          { id: "A", x: "0 m", y: "0 m", support: "pinned" },
          { id: "B", x: "L", y: "0 m", support: "roller-x" },
        ],
        members: [{ id: "m", start: "A", end: "B", E: "200 GPa", A: "beam_A", I: "beam_Ix", group: "beams" }],
        load_cases: [{ id: "W", loads: [{ member: "m", direction: "global-y", w: "-10 kN/m" }] }],
      },
      extracts: { delta: { max_abs: "relative_deflection", members: "beams", under: "W", unit: "mm" } },
      verification: [
        {
          name: "Deflection of the 400 deep section",
          inputs: { beam: "TB 400" },
          expect: { delta: { value: `5 * 10 kN/m * (6 m)^4 / (384 * 200 GPa * ${Ix} m^4)`, tolerance: 1e-6 } },
          source: "AWC Design Aid No. 6 (2005), Fig. 1: Δmax = 5wL⁴/384EI",
        },
      ],
    };
    const { versionId, slug } = await publish(`---\n${stringify(definition)}---\n# Beam\n`, lead, reviewer);
    const job = await newJob(engineer, lead);

    const form = await runUseCase(readRunForm, { actor: engineer, input: { jobNumber: job.number, slug } });
    expect(form.fields.find((f) => f.key === "beam")).toMatchObject({
      kind: "entry",
      library,
      libraryVersion: 1,
      options: [
        { key: "TB 300", type: "i" },
        { key: "TB 400", type: "i" },
      ],
    });

    const run = await runUseCase(createRun, {
      actor: engineer,
      input: { jobId: job.jobId, versionId, inputs: { beam: "tb 400" }, unitSystem: "si" },
    });
    const [row] = await db.select().from(schema.runs).where(eq(schema.runs.id, run.id));
    const record = readRunRecord(row.record);
    const [published] = await pool
      .query<{ id: string; entry_hash: string }>(
        `select e.id, e.entry_hash from library_version_entries e join library_versions v on v.id = e.version_id
         join libraries l on l.id = v.library_id where l.slug = $1 and v.number = 1 and e.normalised_key = 'tb 400'`,
        [library],
      )
      .then((r) => r.rows);
    expect(record.libraries).toEqual([
      {
        input: "beam",
        library,
        version: 1,
        contentHash: expect.stringMatching(/^[0-9a-f]{64}$/),
        key: "TB 400",
        entryId: published.id,
        entryHash: published.entry_hash,
      },
    ]);
    const { rows: used } = await pool.query(`select input_key, entry_id, entry_hash from run_library_entries where run_id = $1`, [
      run.id,
    ]);
    expect(used).toEqual([{ input_key: "beam", entry_id: published.id, entry_hash: published.entry_hash }]);
    // The value the standard read is the entry's: 5wL⁴/384EI with the 400 deep section's Ix (AWC DA-6, Fig. 1).
    if (record.outcome !== "succeeded") throw new Error("expected a result");
    expect(record.evaluation.extracts.delta.si / ((5 * 10e3 * 6 ** 4) / (384 * 200e9 * Ix))).toBeCloseTo(1, 6);
  });
});
