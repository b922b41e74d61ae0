// What each leaf kind seals, as SQL over its source table `s`: the record whose sha256 the leaf's entry holds, and the
// time in the entry. The migration's trigger (drizzle/0013_verifiable_log.sql, gusset_log_row) builds the same
// expressions when a row is inserted; the integrity check (lib/data/log-check.ts) recomputes them from the rows as
// they are now, with pg_catalog's functions only, so a changed row no longer matches its sealed leaf. A run's record
// is its canonical record text itself; an event's is PostgreSQL's jsonb text of its columns (deterministic: jsonb
// sorts its keys and prints one form per value).
import type { LogLeafKind } from "@/db/schema";

const isoMicros = (column: string) => `to_char(${column} AT TIME ZONE 'UTC', 'YYYY-MM-DD"T"HH24:MI:SS.US"Z"')`;
/** The entry's `at`: milliseconds, as leafEntryBytes requires. */
const isoMillis = (column: string) => `to_char(${column} AT TIME ZONE 'UTC', 'YYYY-MM-DD"T"HH24:MI:SS.MS"Z"')`;

export type LeafSource = {
  kind: LogLeafKind;
  table: string;
  /** The record's text, over the source row `s`. */
  record: string;
  /** The row's time column, over `s`; the entry's `at` is it in UTC to the millisecond. */
  time: string;
  at: string;
};

const jsonbOf = (pairs: Record<string, string>) =>
  `jsonb_build_object(${Object.entries(pairs)
    .map(([key, value]) => `'${key}', ${value}`)
    .join(", ")})::text`;

export const LEAF_SOURCES: readonly LeafSource[] = [
  { kind: "run", table: "runs", record: "s.record", time: "s.created_at", at: isoMillis("s.created_at") },
  {
    kind: "sign-off",
    table: "calc_revision_events",
    record: jsonbOf({
      id: "s.id",
      revision_id: "s.revision_id",
      kind: "s.kind",
      issue_status: "s.issue_status",
      actor_id: "s.actor_id",
      note: "s.note",
      reason: "s.reason",
      occurred_at: isoMicros("s.occurred_at"),
    }),
    time: "s.occurred_at",
    at: isoMillis("s.occurred_at"),
  },
  {
    kind: "version-event",
    table: "standard_version_events",
    record: jsonbOf({
      id: "s.id",
      version_id: "s.version_id",
      kind: "s.kind",
      reason: "s.reason",
      actor_id: "s.actor_id",
      occurred_at: isoMicros("s.occurred_at"),
    }),
    time: "s.occurred_at",
    at: isoMillis("s.occurred_at"),
  },
  {
    kind: "library-event",
    table: "library_version_events",
    record: jsonbOf({
      id: "s.id",
      version_id: "s.version_id",
      kind: "s.kind",
      entry_key: "s.entry_key",
      reason: "s.reason",
      actor_id: "s.actor_id",
      occurred_at: isoMicros("s.occurred_at"),
    }),
    time: "s.occurred_at",
    at: isoMillis("s.occurred_at"),
  },
  {
    kind: "attachment",
    table: "job_attachments",
    record: jsonbOf({
      id: "s.id",
      job_id: "s.job_id",
      run_id: "s.run_id",
      sha256: "s.sha256",
      file_name: "s.file_name",
      content_type: "s.content_type",
      bytes: "s.bytes",
      note: "s.note",
      uploaded_by_id: "s.uploaded_by_id",
      uploaded_at: isoMicros("s.uploaded_at"),
    }),
    time: "s.uploaded_at",
    at: isoMillis("s.uploaded_at"),
  },
  {
    kind: "audit-event",
    table: "audit_events",
    record: jsonbOf({
      id: "s.id",
      actor_id: "s.actor_id",
      actor_email: "s.actor_email",
      action: "s.action",
      subject: "s.subject",
      details: "s.details",
      ip_address: "s.ip_address",
      occurred_at: isoMicros("s.occurred_at"),
    }),
    time: "s.occurred_at",
    at: isoMillis("s.occurred_at"),
  },
];

/** The sha256 (hex) of a record expression, with pg_catalog's function (a look-alike in another schema is not used). */
export const sha256Of = (expression: string) => `encode(pg_catalog.sha256(convert_to(${expression}, 'UTF8')), 'hex')`;
