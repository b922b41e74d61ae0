import "server-only";
// After a withdrawal. The withdrawal itself is the standards' or the libraries' use case (standards.ts,
// libraries.ts), which calls `recordWithdrawal` in its transaction: the withdrawal's row, the declared mapping onto
// the successor (checked against both versions' inputs), and one e-mail per affected person queued. Here: the impact
// report (every run, calc revision, job and person that used what was withdrawn, issued calcs first), and the signed
// outcome of each affected calc revision. Batch re-runs: ./batch-reruns.ts.
import { AppError } from "@/lib/domain/errors";
import { z } from "@/lib/domain/zod";
import type { Actor } from "@/lib/domain/actor";
import { can } from "@/lib/domain/permissions";
import { declareSuccessorSchema, recordOutcomeSchema, withdrawalRefSchema } from "@/lib/domain/schemas/withdrawals";
import type { InputMapping } from "@/db/schema";
import { serverEnv } from "@/lib/server-env";
import { enqueueJob } from "@/lib/jobs/enqueue";
import { renderWithdrawalNoticeMail } from "@/lib/mail/templates";
import { getVersion, listVersionsOf } from "@/lib/data/standards";
import { getLibraryBySlug, getLibraryVersion, listLibraryVersionsOf } from "@/lib/data/libraries";
import { getCalc, getRevision } from "@/lib/data/calcs";
import {
  findWithdrawalId,
  getLatestBatch,
  getLatestMapping,
  getWithdrawal,
  insertMapping,
  insertOutcome,
  insertWithdrawal,
  listAffectedRevisions,
  listAffectedRuns,
  listOutcomes,
  listWithdrawals,
  type AffectedRevisionDto,
  type AffectedRunDto,
  type BatchDto,
  type MappingDto,
  type OutcomeDto,
  type WithdrawalDto,
} from "@/lib/data/withdrawals";
import { normaliseEntryKey } from "@/lib/standards/library-inputs";
import { EMPTY_MAPPING } from "@/lib/domain/schemas/withdrawals";
import { defineUseCase } from "./use-case";
import { definitionOf } from "./run-store";
import { checkMappingOrThrow } from "./withdrawal-mapping";

type Subject = { standardVersionId: string } | { libraryVersionId: string } | { libraryEntryId: string };

const appUrl = (path: string) => `${serverEnv().BETTER_AUTH_URL.replace(/\/$/, "")}${path}`;

/** The successor named for a standard version: published, not withdrawn, of the same standard; the mapping checked. */
async function successorMappingOrThrow(versionId: string, successorVersionId: string, mapping: InputMapping) {
  const withdrawn = (await getVersion({ id: versionId }))!;
  const successor = await getVersion({ id: successorVersionId });
  const field = { fieldErrors: { successorVersionId: ["Choose a published version of the same standard."] } };
  if (!successor || successor.standardId !== withdrawn.standardId)
    throw new AppError("invalid-input", `The successor must be a published version of ${withdrawn.title}.`, field);
  if (successor.id === withdrawn.id) throw new AppError("invalid-input", "A version cannot succeed itself.", field);
  if (successor.status === "withdrawn")
    throw new AppError("invalid-input", `Version ${successor.number} is withdrawn too; name a version in use.`, field);
  return checkMappingOrThrow(definitionOf(withdrawn), definitionOf(successor), mapping, `version ${successor.number}`);
}

/** A library's replacement entry: one in use (not withdrawn) in a version in use of the same library. */
async function replacementOrThrow(slug: string, key: string): Promise<string> {
  const library = (await getLibraryBySlug(slug))!;
  for (const summary of await listLibraryVersionsOf(library.id)) {
    if (summary.status === "withdrawn") continue;
    const version = (await getLibraryVersion({ id: summary.id }))!;
    const entry = version.entryRows.find((row) => row.normalisedKey === normaliseEntryKey(key));
    if (entry && !entry.withdrawn) return entry.key;
  }
  throw new AppError("invalid-input", `No version in use of ${slug} has an entry “${key}” that is not withdrawn.`, {
    fieldErrors: { replacementKey: [`Name an entry of ${slug} that is in use.`] },
  });
}

/**
 * Called by the withdraw use cases inside their transaction, after the version or library event: the withdrawal's
 * row, its mapping, and one e-mail per affected person queued (sent by the worker after the commit). Returns how
 * many people are told.
 */
export async function recordWithdrawal(
  subject: Subject,
  {
    actor,
    reason,
    successorVersionId,
    mapping,
    library,
  }: {
    actor: Actor;
    reason: string;
    successorVersionId?: string;
    mapping?: InputMapping;
    /** For a library withdrawal: the library's slug and the replacement entry, if one is named. */
    library?: { slug: string; replacementKey?: string };
  },
): Promise<{ withdrawalId: string; notified: number; successorNumber: number | null; replacement: string | null }> {
  const { id: withdrawalId } = await insertWithdrawal({
    subject:
      "standardVersionId" in subject ? "standard-version" : "libraryVersionId" in subject ? "library-version" : "library-entry",
    ...subject,
    reason,
    actorId: actor.id,
  });
  let successorNumber: number | null = null;
  let replacement: string | null = null;
  if ("standardVersionId" in subject) {
    if (mapping && !successorVersionId)
      throw new AppError("invalid-input", "Name the version that replaces it before mapping inputs onto it.", {
        fieldErrors: { successorVersionId: ["Choose the version the inputs map onto."] },
      });
    if (successorVersionId) {
      const checked = await successorMappingOrThrow(subject.standardVersionId, successorVersionId, mapping ?? EMPTY_MAPPING);
      await insertMapping({ withdrawalId, successorVersionId, mapping: checked, declaredById: actor.id });
      successorNumber = (await getVersion({ id: successorVersionId }))!.number;
    }
  } else if (library) {
    replacement = library.replacementKey ? await replacementOrThrow(library.slug, library.replacementKey) : null;
    // A library withdrawal re-runs each run on its own version; the replacement entry, when named, takes the place
    // of the withdrawn one.
    await insertMapping({ withdrawalId, replacementEntryKey: replacement, mapping: EMPTY_MAPPING, declaredById: actor.id });
  }
  const withdrawal = (await getWithdrawal(withdrawalId))!;
  const notified = await queueNotices(withdrawal, await listAffectedRuns(withdrawal), {
    by: actor.name,
    successor:
      successorNumber !== null
        ? `version ${successorNumber} of ${withdrawal.slug}`
        : replacement
          ? `the entry ${replacement}`
          : null,
  });
  return { withdrawalId, notified, successorNumber, replacement };
}

/** One e-mail per person: each affected run's preparer, each affected job's responsible engineer; nobody else. */
async function queueNotices(
  withdrawal: WithdrawalDto,
  runs: AffectedRunDto[],
  { by, successor }: { by: string; successor: string | null },
): Promise<number> {
  type Person = { email: string; name: string; runs: AffectedRunDto[]; jobs: Map<string, { jobName: string; runs: number }> };
  const people = new Map<string, Person>();
  const personOf = (id: string, name: string, email: string) => {
    let person = people.get(id);
    if (!person) people.set(id, (person = { email, name, runs: [], jobs: new Map() }));
    return person;
  };
  for (const run of runs) {
    personOf(run.createdById, run.createdByName, run.createdByEmail).runs.push(run);
    if (run.responsibleEngineerId && run.responsibleEngineerEmail) {
      const engineer = personOf(run.responsibleEngineerId, run.responsibleEngineerName ?? "", run.responsibleEngineerEmail);
      const job = engineer.jobs.get(run.jobNumber) ?? { jobName: run.jobName, runs: 0 };
      job.runs += 1;
      engineer.jobs.set(run.jobNumber, job);
    }
  }
  for (const person of people.values())
    await enqueueJob(
      "mail.send",
      renderWithdrawalNoticeMail({
        to: person.email,
        name: person.name,
        what: withdrawal.label,
        reason: withdrawal.reason,
        withdrawnBy: by,
        successor,
        reportUrl: appUrl(`/withdrawals/${withdrawal.id}`),
        runs: person.runs.map((run) => ({ jobNumber: run.jobNumber, runId: run.id, url: appUrl(`/runs/${run.id}`) })),
        jobs: [...person.jobs.entries()].map(([jobNumber, job]) => ({ jobNumber, ...job })),
      }),
    );
  return people.size;
}

export type ImpactRevision = AffectedRevisionDto & {
  /** Every outcome recorded for it, oldest first; the last is the one in force. */
  outcomes: OutcomeDto[];
  /** Awaiting a signed outcome. A revision its checker returned was never issued and needs none. */
  open: boolean;
  tracked: boolean;
  /** The calc's other revisions, checked and not on what was withdrawn: what "re-run and re-checked" may name. */
  candidates: { id: string; letter: string }[];
};

export type ImpactJob = {
  jobId: string;
  jobNumber: string;
  jobName: string;
  jobStatus: string;
  responsibleEngineerName: string | null;
  runs: number;
  revisions: number;
  open: number;
};

export type ImpactPerson = { id: string; name: string; email: string; runs: number; jobs: string[] };

export type ImpactReport = {
  withdrawal: WithdrawalDto;
  mapping: MappingDto | null;
  runs: AffectedRunDto[];
  revisions: ImpactRevision[];
  jobs: ImpactJob[];
  people: ImpactPerson[];
  batch: BatchDto | null;
};

/** Everything that used what was withdrawn; issued calc revisions first, then jobs (issued calcs, then runs), runs, people. */
export async function impactReportOf(withdrawal: WithdrawalDto): Promise<ImpactReport> {
  const [runs, affected, outcomes, mapping, batch] = await Promise.all([
    listAffectedRuns(withdrawal),
    listAffectedRevisions(withdrawal),
    listOutcomes(withdrawal.id),
    getLatestMapping(withdrawal.id),
    getLatestBatch(withdrawal.id),
  ]);
  const affectedIds = new Set(affected.map((r) => r.id));
  const calcs = new Map<string, { id: string; letter: string }[]>();
  for (const calcId of new Set(affected.map((r) => r.calcId))) {
    const calc = await getCalc(calcId);
    calcs.set(
      calcId,
      (calc?.revisions ?? [])
        .filter((r) => !affectedIds.has(r.id) && (r.state === "awaiting-approval" || r.state === "approved"))
        .map((r) => ({ id: r.id, letter: r.letter })),
    );
  }
  const revisions = affected.map((revision) => {
    const own = outcomes.filter((o) => o.revisionId === revision.id);
    const tracked = revision.state !== "returned";
    return {
      ...revision,
      outcomes: own,
      tracked,
      open: tracked && own.length === 0,
      candidates: calcs.get(revision.calcId) ?? [],
    };
  });
  const jobs = new Map<string, ImpactJob>();
  for (const run of runs) {
    const job = jobs.get(run.jobId) ?? {
      jobId: run.jobId,
      jobNumber: run.jobNumber,
      jobName: run.jobName,
      jobStatus: run.jobStatus,
      responsibleEngineerName: run.responsibleEngineerName,
      runs: 0,
      revisions: 0,
      open: 0,
    };
    job.runs += 1;
    jobs.set(run.jobId, job);
  }
  for (const revision of revisions) {
    const job = jobs.get(revision.jobId);
    if (!job) continue;
    if (revision.tracked) job.revisions += 1;
    if (revision.open) job.open += 1;
  }
  const people = new Map<string, ImpactPerson>();
  const add = (id: string, name: string, email: string) => {
    const person = people.get(id) ?? { id, name, email, runs: 0, jobs: [] };
    people.set(id, person);
    return person;
  };
  for (const run of runs) {
    add(run.createdById, run.createdByName, run.createdByEmail).runs += 1;
    if (run.responsibleEngineerId) {
      const engineer = add(run.responsibleEngineerId, run.responsibleEngineerName ?? "", run.responsibleEngineerEmail ?? "");
      if (!engineer.jobs.includes(run.jobNumber)) engineer.jobs.push(run.jobNumber);
    }
  }
  return {
    withdrawal,
    mapping,
    runs,
    // Issued calcs first: open ones, then those with an outcome, then revisions that were never issued.
    revisions: revisions.sort((a, b) => Number(b.open) - Number(a.open) || Number(b.tracked) - Number(a.tracked)),
    jobs: [...jobs.values()].sort(
      (a, b) => b.revisions - a.revisions || b.runs - a.runs || a.jobNumber.localeCompare(b.jobNumber),
    ),
    people: [...people.values()].sort((a, b) => a.name.localeCompare(b.name)),
    batch,
  };
}

export const readImpactReport = defineUseCase({
  name: "withdrawals.impact",
  permission: "runs.read",
  input: withdrawalRefSchema,
  run: async ({ id }): Promise<ImpactReport> => {
    const withdrawal = await getWithdrawal(id);
    if (!withdrawal) throw new AppError("not-found", "There is no withdrawal with that id.");
    return impactReportOf(withdrawal);
  },
  audit: null,
});

export const readWithdrawals = defineUseCase({
  name: "withdrawals.list",
  permission: "runs.read",
  input: z.object({}).default({}),
  run: async () => listWithdrawals(),
  audit: null,
});

/** A lead, or the responsible engineer of the calc's job, may sign an outcome (the engineer for their own job only). */
export function maySignOutcome(actor: Actor, revision: { responsibleEngineerId: string | null }): boolean {
  if (actor.role === "lead") return true;
  return can(actor.role, "withdrawals.record-outcome") && revision.responsibleEngineerId === actor.id;
}

export const recordOutcome = defineUseCase({
  name: "withdrawals.outcome",
  permission: "withdrawals.record-outcome",
  input: recordOutcomeSchema,
  run: async ({ withdrawalId, revisionId, outcome, reason, newRevisionId, reference }, { actor }) => {
    const withdrawal = await getWithdrawal(withdrawalId);
    if (!withdrawal) throw new AppError("not-found", "There is no withdrawal with that id.");
    const affected = await listAffectedRevisions(withdrawal);
    const revision = affected.find((r) => r.id === revisionId);
    if (!revision)
      throw new AppError("not-found", `That calc revision did not use ${withdrawal.label}.`, {
        fieldErrors: { revisionId: ["Choose a calc revision listed on this impact report."] },
      });
    if (!maySignOutcome(actor, revision))
      throw new AppError(
        "forbidden",
        `Only a standards lead or the responsible engineer of job ${revision.jobNumber} records the outcome for ${revision.calcNumber}.`,
      );
    if (revision.state === "returned")
      throw new AppError(
        "conflict",
        `${revision.calcNumber} rev ${revision.letter} was returned by its checker and never issued.`,
      );
    let newLabel: string | null = null;
    if (outcome === "rerun-checked") {
      const next = await getRevision(newRevisionId!);
      const field = { fieldErrors: { newRevisionId: [`Choose a checked revision of ${revision.calcNumber}.`] } };
      if (!next || next.calcId !== revision.calcId)
        throw new AppError("invalid-input", `The new revision must be a revision of ${revision.calcNumber}.`, field);
      if (affected.some((r) => r.id === next.id))
        throw new AppError("invalid-input", `${revision.calcNumber} rev ${next.letter} used ${withdrawal.label} too.`, field);
      if (next.state !== "awaiting-approval" && next.state !== "approved")
        throw new AppError("invalid-input", `${revision.calcNumber} rev ${next.letter} has not been checked yet.`, field);
      newLabel = next.letter;
    }
    await insertOutcome({
      withdrawalId,
      revisionId,
      kind: outcome,
      reason: reason ?? null,
      newRevisionId: outcome === "rerun-checked" ? newRevisionId! : null,
      reference: outcome === "drawings-revised" ? reference! : null,
      actorId: actor.id,
    });
    return {
      withdrawalId,
      revisionId,
      calc: revision.calcNumber,
      letter: revision.letter,
      outcome,
      reason: reason ?? null,
      newRevision: newLabel,
      reference: outcome === "drawings-revised" ? reference! : null,
    };
  },
  audit: ({ result }) => ({
    action: "withdrawals.outcome",
    subject: `withdrawal:${result.withdrawalId}`,
    details: {
      calc: result.calc,
      letter: result.letter,
      outcome: result.outcome,
      reason: result.reason,
      newRevision: result.newRevision,
      reference: result.reference,
    },
  }),
});

export type SuccessorInput = { label: string; quantity: string; unit: string | null; default: string | number };
export type SuccessorOption = { id: string; number: number; title: string; inputs: Record<string, SuccessorInput> };
export type VersionWithdrawal = {
  /** Its withdrawal, once withdrawn (the impact report's id). */
  withdrawalId: string | null;
  /** This version's inputs, and the versions a withdrawal may name as its successor with theirs (for the mapping). */
  inputs: Record<string, SuccessorInput>;
  successors: SuccessorOption[];
};

const inputsOf = (version: Parameters<typeof definitionOf>[0]): Record<string, SuccessorInput> =>
  Object.fromEntries(
    Object.entries(definitionOf(version).inputs).map(([key, input]) => [
      key,
      { label: input.label, quantity: input.quantity, unit: input.unit ?? null, default: input.default },
    ]),
  );

/** What a version's page (and its impact report) needs about withdrawing it: its report once withdrawn, the successors to offer. */
export const readVersionWithdrawal = defineUseCase({
  name: "withdrawals.of-version",
  permission: "library.read",
  input: z.object({ versionId: z.uuid("That is not a version's id.") }),
  run: async ({ versionId }): Promise<VersionWithdrawal> => {
    const version = await getVersion({ id: versionId });
    if (!version) throw new AppError("not-found", "That version does not exist.");
    const withdrawalId = await findWithdrawalId({ standardVersionId: versionId });
    const others = (await listVersionsOf(version.standardId)).filter((v) => v.id !== versionId && v.status !== "withdrawn");
    const successors: SuccessorOption[] = [];
    for (const summary of others) {
      const candidate = (await getVersion({ id: summary.id }))!;
      successors.push({ id: candidate.id, number: candidate.number, title: candidate.title, inputs: inputsOf(candidate) });
    }
    return { withdrawalId, inputs: inputsOf(version), successors: successors.sort((a, b) => b.number - a.number) };
  },
  audit: null,
});

/**
 * Names (or names again) the successor of a withdrawn standard version, with the mapping of inputs, after the
 * withdrawal: a version often comes out to fix the one withdrawn. A new mapping row; the latest is in force, and a
 * new mapping may be re-run as a batch of its own.
 */
export const declareSuccessor = defineUseCase({
  name: "withdrawals.successor",
  permission: "templates.withdraw",
  input: declareSuccessorSchema,
  run: async ({ withdrawalId, successorVersionId, mapping }, { actor }) => {
    const withdrawal = await getWithdrawal(withdrawalId);
    if (!withdrawal) throw new AppError("not-found", "There is no withdrawal with that id.");
    if (withdrawal.subject !== "standard-version")
      throw new AppError("conflict", "A library's replacement entry is named when it is withdrawn.");
    const checked = await successorMappingOrThrow(withdrawal.standardVersionId!, successorVersionId, mapping);
    await insertMapping({ withdrawalId, successorVersionId, mapping: checked, declaredById: actor.id });
    const successor = (await getVersion({ id: successorVersionId }))!;
    return { withdrawalId, label: withdrawal.label, successor: successor.number };
  },
  audit: ({ result }) => ({
    action: "withdrawals.successor",
    subject: `withdrawal:${result.withdrawalId}`,
    details: { withdrawn: result.label, successor: result.successor },
  }),
});
