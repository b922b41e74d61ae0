import "server-only";
// Withdrawals and their impact: which runs, calc revisions, jobs and people used a withdrawn standard version or
// library entry, the declared mapping onto the successor, the outcome recorded for each affected calc revision,
// and batch re-runs. Rows here are only ever added (db/schema/withdrawals.ts); permissions are the use cases'.
import { and, eq, sql, type SQL } from "drizzle-orm";
import {
  rerunBatches,
  rerunBatchItems,
  withdrawalMappings,
  withdrawalOutcomes,
  withdrawals,
  type CheckDelta,
  type InputMapping,
  type OutcomeKind,
  type RerunStatus,
  type WithdrawalSubject,
} from "@/db/schema";
import { stateOf, type CalcEventDto, type RevisionState } from "./calcs";
import { currentDb } from "./transaction";

const iso = (value: Date | string) => new Date(value).toISOString();

export type WithdrawalDto = {
  id: string;
  subject: WithdrawalSubject;
  reason: string;
  actorName: string | null;
  occurredAt: string;
  /** What was withdrawn, in words: "Simply supported steel beam v2", "MF-I 310x165 in firm-sections v1". */
  label: string;
  standardVersionId: string | null;
  /** The standard whose version was withdrawn (successors are its versions). */
  standardId: string | null;
  slug: string;
  number: number;
  libraryVersionId: string | null;
  libraryEntryId: string | null;
  entryKey: string | null;
};

export async function insertWithdrawal(values: typeof withdrawals.$inferInsert): Promise<{ id: string }> {
  const [row] = await currentDb().insert(withdrawals).values(values).returning({ id: withdrawals.id });
  return row;
}

export async function insertMapping(values: typeof withdrawalMappings.$inferInsert): Promise<{ id: string }> {
  const [row] = await currentDb().insert(withdrawalMappings).values(values).returning({ id: withdrawalMappings.id });
  return row;
}

type WithdrawalRow = {
  id: string;
  subject: WithdrawalSubject;
  reason: string;
  actor_name: string | null;
  occurred_at: Date | string;
  standard_version_id: string | null;
  standard_id: string | null;
  library_version_id: string | null;
  library_entry_id: string | null;
  slug: string;
  number: number;
  title: string | null;
  entry_key: string | null;
};

async function selectWithdrawals(where: SQL, limit = 100): Promise<WithdrawalDto[]> {
  const { rows } = await currentDb().execute<WithdrawalRow>(sql`
    select w.id, w.subject, w.reason, u.name as actor_name, w.occurred_at, w.standard_version_id, sv.standard_id,
           w.library_version_id, w.library_entry_id,
           coalesce(s.slug, l.slug) as slug, coalesce(sv.number, lv.number) as number, sv.title, le.key as entry_key
      from withdrawals w
      left join "user" u on u.id = w.actor_id
      left join standard_versions sv on sv.id = w.standard_version_id
      left join standards s on s.id = sv.standard_id
      left join library_version_entries le on le.id = w.library_entry_id
      left join library_versions lv on lv.id = coalesce(w.library_version_id, le.version_id)
      left join libraries l on l.id = lv.library_id
     where ${where}
     order by w.occurred_at desc
     limit ${limit}`);
  return rows.map((row) => ({
    id: row.id,
    subject: row.subject,
    reason: row.reason,
    actorName: row.actor_name,
    occurredAt: iso(row.occurred_at),
    label:
      row.subject === "standard-version"
        ? `${row.title ?? row.slug} v${row.number}`
        : row.subject === "library-version"
          ? `${row.slug} v${row.number}`
          : `${row.entry_key} in ${row.slug} v${row.number}`,
    standardVersionId: row.standard_version_id,
    standardId: row.standard_id,
    slug: row.slug,
    number: Number(row.number),
    libraryVersionId: row.library_version_id,
    libraryEntryId: row.library_entry_id,
    entryKey: row.entry_key,
  }));
}

export async function getWithdrawal(id: string): Promise<WithdrawalDto | null> {
  return (await selectWithdrawals(sql`w.id = ${id}`))[0] ?? null;
}

export async function listWithdrawals(): Promise<WithdrawalDto[]> {
  return selectWithdrawals(sql`true`, 200);
}

/** The withdrawals that touch a run: of its version, of a library version or entry it used. */
export async function listWithdrawalsOfRun(runId: string): Promise<WithdrawalDto[]> {
  return selectWithdrawals(sql`w.id in (
    select w2.id from withdrawals w2 join runs r on r.version_id = w2.standard_version_id where r.id = ${runId}
    union
    select w2.id from run_library_entries rle
      join library_version_entries e on e.id = rle.entry_id
      join withdrawals w2 on w2.library_entry_id = e.id or w2.library_version_id = e.version_id
     where rle.run_id = ${runId})`);
}

/** The withdrawal of a standard version, a library version or one entry, when it has one. */
export async function findWithdrawalId(
  of: { standardVersionId: string } | { libraryVersionId: string } | { libraryEntryId: string },
): Promise<string | null> {
  const where =
    "standardVersionId" in of
      ? eq(withdrawals.standardVersionId, of.standardVersionId)
      : "libraryVersionId" in of
        ? eq(withdrawals.libraryVersionId, of.libraryVersionId)
        : eq(withdrawals.libraryEntryId, of.libraryEntryId);
  const [row] = await currentDb().select({ id: withdrawals.id }).from(withdrawals).where(where);
  return row?.id ?? null;
}

export type MappingDto = {
  id: string;
  successorVersionId: string | null;
  successorNumber: number | null;
  successorTitle: string | null;
  replacementEntryKey: string | null;
  mapping: InputMapping;
  declaredByName: string;
  declaredAt: string;
};

/** The mapping in force: the latest declared. */
export async function getLatestMapping(withdrawalId: string): Promise<MappingDto | null> {
  const { rows } = await currentDb().execute<{
    id: string;
    successor_version_id: string | null;
    number: number | null;
    title: string | null;
    replacement_entry_key: string | null;
    mapping: InputMapping;
    name: string;
    declared_at: Date | string;
  }>(sql`
    select m.id, m.successor_version_id, sv.number, sv.title, m.replacement_entry_key, m.mapping, u.name, m.declared_at
      from withdrawal_mappings m
      join "user" u on u.id = m.declared_by_id
      left join standard_versions sv on sv.id = m.successor_version_id
     where m.withdrawal_id = ${withdrawalId}
     order by m.declared_at desc, m.id desc
     limit 1`);
  const row = rows[0];
  if (!row) return null;
  return {
    id: row.id,
    successorVersionId: row.successor_version_id,
    successorNumber: row.number === null ? null : Number(row.number),
    successorTitle: row.title,
    replacementEntryKey: row.replacement_entry_key,
    mapping: row.mapping,
    declaredByName: row.name,
    declaredAt: iso(row.declared_at),
  };
}

export type AffectedRunDto = {
  id: string;
  jobId: string;
  jobNumber: string;
  jobName: string;
  jobStatus: string;
  responsibleEngineerId: string | null;
  responsibleEngineerName: string | null;
  responsibleEngineerEmail: string | null;
  versionId: string;
  slug: string;
  title: string;
  number: number;
  outcome: "succeeded" | "failed";
  pass: boolean | null;
  maxUtilisation: number | null;
  purpose: string;
  createdById: string;
  createdByName: string;
  createdByEmail: string;
  createdAt: string;
};

/** The ids of the runs a withdrawal touches, as a subquery. */
function affectedRunIds(
  withdrawal: Pick<WithdrawalDto, "subject" | "standardVersionId" | "libraryVersionId" | "libraryEntryId">,
) {
  if (withdrawal.subject === "standard-version")
    return sql`select id from runs where version_id = ${withdrawal.standardVersionId}`;
  if (withdrawal.subject === "library-version")
    return sql`select rle.run_id from run_library_entries rle join library_version_entries e on e.id = rle.entry_id
                where e.version_id = ${withdrawal.libraryVersionId}`;
  return sql`select run_id from run_library_entries where entry_id = ${withdrawal.libraryEntryId}`;
}

/** Every run that used what was withdrawn, by job then newest first. */
export async function listAffectedRuns(withdrawal: WithdrawalDto): Promise<AffectedRunDto[]> {
  const { rows } = await currentDb().execute<Record<string, unknown>>(sql`
    select r.id, r.job_id, j.job_number, j.name as job_name, j.status as job_status,
           j.responsible_engineer_id, re.name as re_name, re.email as re_email,
           r.version_id, s.slug, sv.title, sv.number, r.outcome, r.pass, r.max_utilisation, r.purpose,
           r.created_by_id, u.name as created_by_name, u.email as created_by_email, r.created_at
      from runs r
      join jobs j on j.id = r.job_id
      left join "user" re on re.id = j.responsible_engineer_id
      join standard_versions sv on sv.id = r.version_id
      join standards s on s.id = sv.standard_id
      join "user" u on u.id = r.created_by_id
     where r.id in (${affectedRunIds(withdrawal)})
     order by j.job_number, r.created_at desc, r.id`);
  return rows.map((row) => ({
    id: row.id as string,
    jobId: row.job_id as string,
    jobNumber: row.job_number as string,
    jobName: row.job_name as string,
    jobStatus: row.job_status as string,
    responsibleEngineerId: row.responsible_engineer_id as string | null,
    responsibleEngineerName: row.re_name as string | null,
    responsibleEngineerEmail: row.re_email as string | null,
    versionId: row.version_id as string,
    slug: row.slug as string,
    title: row.title as string,
    number: Number(row.number),
    outcome: row.outcome as "succeeded" | "failed",
    pass: row.pass as boolean | null,
    maxUtilisation: row.max_utilisation === null ? null : Number(row.max_utilisation),
    purpose: row.purpose as string,
    createdById: row.created_by_id as string,
    createdByName: row.created_by_name as string,
    createdByEmail: row.created_by_email as string,
    createdAt: iso(row.created_at as Date),
  }));
}

export type AffectedRevisionDto = {
  id: string;
  calcId: string;
  calcNumber: string;
  calcTitle: string;
  letter: string;
  runId: string;
  jobId: string;
  jobNumber: string;
  responsibleEngineerId: string | null;
  preparerName: string;
  checkerName: string;
  state: RevisionState;
  issueStatus: string | null;
  createdAt: string;
};

/** The calc revisions whose design-of-record run used what was withdrawn. */
export async function listAffectedRevisions(withdrawal: WithdrawalDto): Promise<AffectedRevisionDto[]> {
  const { rows } = await currentDb().execute<Record<string, unknown>>(sql`
    select cr.id, cr.calc_id, c.number as calc_number, c.title as calc_title, cr.letter, cr.run_id, c.job_id,
           j.job_number, j.responsible_engineer_id, p.name as preparer_name, k.name as checker_name, cr.created_at,
           coalesce((select json_agg(json_build_object('kind', e.kind, 'issueStatus', e.issue_status) order by e.id)
                       from calc_revision_events e where e.revision_id = cr.id), '[]'::json) as events
      from calc_revisions cr
      join calcs c on c.id = cr.calc_id
      join jobs j on j.id = c.job_id
      join "user" p on p.id = cr.preparer_id
      join "user" k on k.id = cr.checker_id
     where cr.run_id in (${affectedRunIds(withdrawal)})
     order by j.job_number, c.number, cr.letter`);
  return rows.map((row) => {
    const events = (row.events as Pick<CalcEventDto, "kind" | "issueStatus">[]).map((e) => ({
      ...e,
      actorId: null,
      actorName: null,
      note: null,
      reason: null,
      occurredAt: "",
    }));
    const { state, issueStatus } = stateOf(events);
    return {
      id: row.id as string,
      calcId: row.calc_id as string,
      calcNumber: row.calc_number as string,
      calcTitle: row.calc_title as string,
      letter: row.letter as string,
      runId: row.run_id as string,
      jobId: row.job_id as string,
      jobNumber: row.job_number as string,
      responsibleEngineerId: row.responsible_engineer_id as string | null,
      preparerName: row.preparer_name as string,
      checkerName: row.checker_name as string,
      state,
      issueStatus,
      createdAt: iso(row.created_at as Date),
    };
  });
}

export type OutcomeDto = {
  id: number;
  revisionId: string;
  kind: OutcomeKind;
  reason: string | null;
  newRevisionId: string | null;
  newRevisionLabel: string | null;
  reference: string | null;
  actorName: string;
  occurredAt: string;
};

export async function listOutcomes(withdrawalId: string): Promise<OutcomeDto[]> {
  const { rows } = await currentDb().execute<Record<string, unknown>>(sql`
    select o.id, o.revision_id, o.kind, o.reason, o.new_revision_id, o.reference, u.name as actor_name, o.occurred_at,
           case when nr.id is null then null else c.number || ' rev ' || nr.letter end as new_label
      from withdrawal_outcomes o
      join "user" u on u.id = o.actor_id
      left join calc_revisions nr on nr.id = o.new_revision_id
      left join calcs c on c.id = nr.calc_id
     where o.withdrawal_id = ${withdrawalId}
     order by o.id`);
  return rows.map((row) => ({
    id: Number(row.id),
    revisionId: row.revision_id as string,
    kind: row.kind as OutcomeKind,
    reason: row.reason as string | null,
    newRevisionId: row.new_revision_id as string | null,
    newRevisionLabel: row.new_label as string | null,
    reference: row.reference as string | null,
    actorName: row.actor_name as string,
    occurredAt: iso(row.occurred_at as Date),
  }));
}

export async function insertOutcome(values: typeof withdrawalOutcomes.$inferInsert): Promise<void> {
  await currentDb().insert(withdrawalOutcomes).values(values);
}

// ---- batch re-runs ------------------------------------------------------------------------------------------

export type BatchDto = {
  id: string;
  withdrawalId: string;
  mappingId: string;
  total: number;
  startedById: string;
  startedByName: string;
  startedAt: string;
};

export async function insertBatch(values: typeof rerunBatches.$inferInsert): Promise<{ id: string }> {
  const [row] = await currentDb().insert(rerunBatches).values(values).returning({ id: rerunBatches.id });
  return row;
}

export async function getBatch(id: string): Promise<BatchDto | null> {
  return (await selectBatches(sql`b.id = ${id}`))[0] ?? null;
}

export async function getLatestBatch(withdrawalId: string): Promise<BatchDto | null> {
  return (await selectBatches(sql`b.withdrawal_id = ${withdrawalId}`))[0] ?? null;
}

export async function batchOfMapping(mappingId: string): Promise<string | null> {
  const [row] = await currentDb().select({ id: rerunBatches.id }).from(rerunBatches).where(eq(rerunBatches.mappingId, mappingId));
  return row?.id ?? null;
}

async function selectBatches(where: SQL): Promise<BatchDto[]> {
  const { rows } = await currentDb().execute<Record<string, unknown>>(sql`
    select b.id, b.withdrawal_id, b.mapping_id, b.total, b.started_by_id, u.name, b.started_at
      from rerun_batches b join "user" u on u.id = b.started_by_id
     where ${where}
     order by b.started_at desc, b.id desc
     limit 1`);
  return rows.map((row) => ({
    id: row.id as string,
    withdrawalId: row.withdrawal_id as string,
    mappingId: row.mapping_id as string,
    total: Number(row.total),
    startedById: row.started_by_id as string,
    startedByName: row.name as string,
    startedAt: iso(row.started_at as Date),
  }));
}

/** Serialises the two deliveries of one re-run (pg-boss delivers at least once): the second finds the first's row. */
export async function lockBatchItem(batchId: string, originalRunId: string): Promise<void> {
  await currentDb().execute(sql`select pg_advisory_xact_lock(hashtext(${`rerun:${batchId}:${originalRunId}`}))`);
}

export async function batchItemExists(batchId: string, originalRunId: string): Promise<boolean> {
  const [row] = await currentDb()
    .select({ id: rerunBatchItems.id })
    .from(rerunBatchItems)
    .where(and(eq(rerunBatchItems.batchId, batchId), eq(rerunBatchItems.originalRunId, originalRunId)));
  return row !== undefined;
}

export async function insertBatchItem(values: typeof rerunBatchItems.$inferInsert): Promise<void> {
  await currentDb().insert(rerunBatchItems).values(values);
}

export type BatchProgressDto = {
  done: number;
  succeeded: number;
  failed: number;
  passToFail: number;
  /** When its latest re-run finished (null before the first). */
  lastFinishedAt: string | null;
};

export async function countBatchItems(batchId: string): Promise<BatchProgressDto> {
  const { rows } = await currentDb().execute<Record<string, unknown>>(sql`
    select count(*) as done,
           count(*) filter (where status = 'succeeded') as succeeded,
           count(*) filter (where status = 'failed') as failed,
           count(*) filter (where newly_failing > 0) as pass_to_fail,
           max(finished_at) as last_finished_at
      from rerun_batch_items where batch_id = ${batchId}`);
  const row = rows[0];
  return {
    done: Number(row.done),
    succeeded: Number(row.succeeded),
    failed: Number(row.failed),
    passToFail: Number(row.pass_to_fail),
    lastFinishedAt: row.last_finished_at ? iso(row.last_finished_at as string | Date) : null,
  };
}

export type BatchItemDto = {
  originalRunId: string;
  newRunId: string | null;
  jobNumber: string;
  status: RerunStatus;
  message: string | null;
  passBefore: boolean | null;
  passAfter: boolean | null;
  utilisationBefore: number | null;
  utilisationAfter: number | null;
  newlyFailing: number;
  checks: CheckDelta[];
};

/**
 * The delta table: checks that went from pass to fail first, then failed re-runs, then the largest changes of
 * utilisation; `limit` rows at most.
 */
export async function listBatchDeltas(batchId: string, limit: number): Promise<BatchItemDto[]> {
  const { rows } = await currentDb().execute<Record<string, unknown>>(sql`
    select i.original_run_id, i.new_run_id, j.job_number, i.status, i.message, i.pass_before, i.pass_after,
           i.utilisation_before, i.utilisation_after, i.newly_failing, i.checks
      from rerun_batch_items i
      join runs r on r.id = i.original_run_id
      join jobs j on j.id = r.job_id
     where i.batch_id = ${batchId}
     order by i.newly_failing desc, (i.status = 'failed') desc,
              abs(coalesce(i.utilisation_after, 0) - coalesce(i.utilisation_before, 0)) desc, i.id
     limit ${limit}`);
  return rows.map((row) => ({
    originalRunId: row.original_run_id as string,
    newRunId: row.new_run_id as string | null,
    jobNumber: row.job_number as string,
    status: row.status as RerunStatus,
    message: row.message as string | null,
    passBefore: row.pass_before as boolean | null,
    passAfter: row.pass_after as boolean | null,
    utilisationBefore: row.utilisation_before === null ? null : Number(row.utilisation_before),
    utilisationAfter: row.utilisation_after === null ? null : Number(row.utilisation_after),
    newlyFailing: Number(row.newly_failing),
    checks: row.checks as CheckDelta[],
  }));
}

/** The library inputs of a run that took the withdrawn entry (or an entry of the withdrawn library version). */
export async function listWithdrawnInputsOfRun(runId: string, withdrawal: WithdrawalDto): Promise<string[]> {
  const { rows } = await currentDb().execute<{ input_key: string }>(sql`
    select rle.input_key from run_library_entries rle join library_version_entries e on e.id = rle.entry_id
     where rle.run_id = ${runId}
       and (e.id = ${withdrawal.libraryEntryId} or e.version_id = ${withdrawal.libraryVersionId})`);
  return rows.map((row) => row.input_key);
}
