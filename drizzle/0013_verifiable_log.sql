CREATE TABLE "log_leaves" (
	"id" bigserial PRIMARY KEY NOT NULL,
	"kind" text NOT NULL,
	"ref" text NOT NULL,
	"entry" text NOT NULL,
	"leaf_hash" "bytea" NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "log_leaves_kind_ref_unique" UNIQUE("kind","ref"),
	CONSTRAINT "log_leaves_hash_check" CHECK (octet_length("log_leaves"."leaf_hash") = 32),
	CONSTRAINT "log_leaves_kind_check" CHECK ("log_leaves"."kind" in ('run', 'sign-off', 'version-event', 'library-event', 'attachment', 'audit-event'))
);
--> statement-breakpoint
CREATE TABLE "log_nodes" (
	"level" smallint NOT NULL,
	"idx" bigint NOT NULL,
	"hash" "bytea" NOT NULL,
	CONSTRAINT "log_nodes_level_idx_pk" PRIMARY KEY("level","idx"),
	CONSTRAINT "log_nodes_hash_check" CHECK (octet_length("log_nodes"."hash") = 32 and "log_nodes"."level" between 0 and 62 and "log_nodes"."idx" >= 0)
);
--> statement-breakpoint
CREATE TABLE "log_pending" (
	"leaf_id" bigint PRIMARY KEY NOT NULL
);
--> statement-breakpoint
CREATE TABLE "log_positions" (
	"leaf_index" bigint PRIMARY KEY NOT NULL,
	"leaf_id" bigint NOT NULL,
	CONSTRAINT "log_positions_leaf_unique" UNIQUE("leaf_id"),
	CONSTRAINT "log_positions_index_check" CHECK ("log_positions"."leaf_index" >= 0)
);
--> statement-breakpoint
CREATE TABLE "log_tree_heads" (
	"size" bigint PRIMARY KEY NOT NULL,
	"root_hash" text NOT NULL,
	"sealed_at" text NOT NULL,
	"signature" text NOT NULL,
	"key_fingerprint" text NOT NULL,
	"frontier" jsonb NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "log_tree_heads_root_check" CHECK ("log_tree_heads"."root_hash" ~ '^[0-9a-f]{64}$' and "log_tree_heads"."size" > 0)
);
--> statement-breakpoint
ALTER TABLE "log_pending" ADD CONSTRAINT "log_pending_leaf_id_log_leaves_id_fk" FOREIGN KEY ("leaf_id") REFERENCES "public"."log_leaves"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "log_positions" ADD CONSTRAINT "log_positions_leaf_id_log_leaves_id_fk" FOREIGN KEY ("leaf_id") REFERENCES "public"."log_leaves"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "log_tree_heads_created_idx" ON "log_tree_heads" USING btree ("created_at");--> statement-breakpoint
-- hand-written: the leaves come from triggers, in the same transaction as the row they seal, so no code path
-- (seed, script, a later feature) can write evidence without a leaf, and writers never wait on each other.
-- A leaf's entry is canonical JSON (RFC 8785: keys sorted, no spaces) {at, kind, ref, sha256}; its hash is
-- RFC 9162's SHA-256(0x00 || entry). `sha256` is that of the sealed record as stored: a run's canonical record
-- text; for an event row, the jsonb_build_object of its columns as text (PostgreSQL's jsonb text is deterministic).
-- lib/data/log-records.ts holds the same expressions for the integrity check, which recomputes them.
CREATE OR REPLACE FUNCTION gusset_log_append(p_kind text, p_ref text, p_sha256 text, p_at timestamptz) RETURNS void
LANGUAGE plpgsql SET search_path = pg_catalog, public AS $$
DECLARE
  v_entry text := format('{"at":"%s","kind":"%s","ref":"%s","sha256":"%s"}',
    to_char(p_at AT TIME ZONE 'UTC', 'YYYY-MM-DD"T"HH24:MI:SS.MS"Z"'), p_kind, p_ref, p_sha256);
  v_id bigint;
BEGIN
  INSERT INTO public.log_leaves (kind, ref, entry, leaf_hash)
    VALUES (p_kind, p_ref, v_entry, pg_catalog.sha256('\x00'::bytea || convert_to(v_entry, 'UTF8')))
    RETURNING id INTO v_id;
  INSERT INTO public.log_pending (leaf_id) VALUES (v_id);
END;
$$;
--> statement-breakpoint
CREATE OR REPLACE FUNCTION gusset_log_sha256(p_text text) RETURNS text
LANGUAGE sql IMMUTABLE SET search_path = pg_catalog AS $$
  SELECT encode(pg_catalog.sha256(convert_to(p_text, 'UTF8')), 'hex')
$$;
--> statement-breakpoint
CREATE OR REPLACE FUNCTION gusset_log_time(p_at timestamptz) RETURNS text
LANGUAGE sql IMMUTABLE SET search_path = pg_catalog AS $$
  SELECT to_char(p_at AT TIME ZONE 'UTC', 'YYYY-MM-DD"T"HH24:MI:SS.US"Z"')
$$;
--> statement-breakpoint
CREATE OR REPLACE FUNCTION gusset_log_row() RETURNS trigger
LANGUAGE plpgsql SET search_path = pg_catalog, public AS $$
DECLARE
  v_record text;
BEGIN
  CASE TG_TABLE_NAME
    WHEN 'runs' THEN
      PERFORM gusset_log_append('run', NEW.id::text, NEW.record_sha256, NEW.created_at);
      RETURN NULL;
    WHEN 'calc_revision_events' THEN
      v_record := jsonb_build_object('id', NEW.id, 'revision_id', NEW.revision_id, 'kind', NEW.kind,
        'issue_status', NEW.issue_status, 'actor_id', NEW.actor_id, 'note', NEW.note, 'reason', NEW.reason,
        'occurred_at', gusset_log_time(NEW.occurred_at))::text;
      PERFORM gusset_log_append('sign-off', NEW.id::text, gusset_log_sha256(v_record), NEW.occurred_at);
    WHEN 'standard_version_events' THEN
      v_record := jsonb_build_object('id', NEW.id, 'version_id', NEW.version_id, 'kind', NEW.kind,
        'reason', NEW.reason, 'actor_id', NEW.actor_id, 'occurred_at', gusset_log_time(NEW.occurred_at))::text;
      PERFORM gusset_log_append('version-event', NEW.id::text, gusset_log_sha256(v_record), NEW.occurred_at);
    WHEN 'library_version_events' THEN
      v_record := jsonb_build_object('id', NEW.id, 'version_id', NEW.version_id, 'kind', NEW.kind,
        'entry_key', NEW.entry_key, 'reason', NEW.reason, 'actor_id', NEW.actor_id,
        'occurred_at', gusset_log_time(NEW.occurred_at))::text;
      PERFORM gusset_log_append('library-event', NEW.id::text, gusset_log_sha256(v_record), NEW.occurred_at);
    WHEN 'job_attachments' THEN
      v_record := jsonb_build_object('id', NEW.id, 'job_id', NEW.job_id, 'run_id', NEW.run_id, 'sha256', NEW.sha256,
        'file_name', NEW.file_name, 'content_type', NEW.content_type, 'bytes', NEW.bytes, 'note', NEW.note,
        'uploaded_by_id', NEW.uploaded_by_id, 'uploaded_at', gusset_log_time(NEW.uploaded_at))::text;
      PERFORM gusset_log_append('attachment', NEW.id::text, gusset_log_sha256(v_record), NEW.uploaded_at);
    WHEN 'audit_events' THEN
      v_record := jsonb_build_object('id', NEW.id, 'actor_id', NEW.actor_id, 'actor_email', NEW.actor_email,
        'action', NEW.action, 'subject', NEW.subject, 'details', NEW.details, 'ip_address', NEW.ip_address,
        'occurred_at', gusset_log_time(NEW.occurred_at))::text;
      PERFORM gusset_log_append('audit-event', NEW.id::text, gusset_log_sha256(v_record), NEW.occurred_at);
  END CASE;
  RETURN NULL;
END;
$$;
--> statement-breakpoint
CREATE TRIGGER runs_log AFTER INSERT ON "runs" FOR EACH ROW EXECUTE FUNCTION gusset_log_row();
--> statement-breakpoint
CREATE TRIGGER calc_revision_events_log AFTER INSERT ON "calc_revision_events" FOR EACH ROW EXECUTE FUNCTION gusset_log_row();
--> statement-breakpoint
CREATE TRIGGER standard_version_events_log AFTER INSERT ON "standard_version_events" FOR EACH ROW EXECUTE FUNCTION gusset_log_row();
--> statement-breakpoint
CREATE TRIGGER library_version_events_log AFTER INSERT ON "library_version_events" FOR EACH ROW EXECUTE FUNCTION gusset_log_row();
--> statement-breakpoint
CREATE TRIGGER job_attachments_log AFTER INSERT ON "job_attachments" FOR EACH ROW EXECUTE FUNCTION gusset_log_row();
--> statement-breakpoint
CREATE TRIGGER audit_events_log AFTER INSERT ON "audit_events" FOR EACH ROW EXECUTE FUNCTION gusset_log_row();
--> statement-breakpoint
-- Rows written before the log existed get their leaves now, oldest first.
DO $$
DECLARE r record;
BEGIN
  FOR r IN
    SELECT 'run' AS kind, id::text AS ref, record_sha256 AS sha, created_at AS at FROM runs
    UNION ALL SELECT 'sign-off', e.id::text, gusset_log_sha256(jsonb_build_object('id', e.id, 'revision_id', e.revision_id,
      'kind', e.kind, 'issue_status', e.issue_status, 'actor_id', e.actor_id, 'note', e.note, 'reason', e.reason,
      'occurred_at', gusset_log_time(e.occurred_at))::text), e.occurred_at FROM calc_revision_events e
    UNION ALL SELECT 'version-event', e.id::text, gusset_log_sha256(jsonb_build_object('id', e.id, 'version_id', e.version_id,
      'kind', e.kind, 'reason', e.reason, 'actor_id', e.actor_id, 'occurred_at', gusset_log_time(e.occurred_at))::text),
      e.occurred_at FROM standard_version_events e
    UNION ALL SELECT 'library-event', e.id::text, gusset_log_sha256(jsonb_build_object('id', e.id, 'version_id', e.version_id,
      'kind', e.kind, 'entry_key', e.entry_key, 'reason', e.reason, 'actor_id', e.actor_id,
      'occurred_at', gusset_log_time(e.occurred_at))::text), e.occurred_at FROM library_version_events e
    UNION ALL SELECT 'attachment', a.id::text, gusset_log_sha256(jsonb_build_object('id', a.id, 'job_id', a.job_id,
      'run_id', a.run_id, 'sha256', a.sha256, 'file_name', a.file_name, 'content_type', a.content_type, 'bytes', a.bytes,
      'note', a.note, 'uploaded_by_id', a.uploaded_by_id, 'uploaded_at', gusset_log_time(a.uploaded_at))::text),
      a.uploaded_at FROM job_attachments a
    UNION ALL SELECT 'audit-event', e.id::text, gusset_log_sha256(jsonb_build_object('id', e.id, 'actor_id', e.actor_id,
      'actor_email', e.actor_email, 'action', e.action, 'subject', e.subject, 'details', e.details,
      'ip_address', e.ip_address, 'occurred_at', gusset_log_time(e.occurred_at))::text), e.occurred_at FROM audit_events e
    ORDER BY at, kind, ref
  LOOP
    PERFORM gusset_log_append(r.kind, r.ref, r.sha, r.at);
  END LOOP;
END;
$$;
--> statement-breakpoint
-- Leaves, their places, the tree's nodes and its heads are evidence: append-only for every role. Only the queue of
-- leaves waiting for the sealer may be deleted from.
CREATE TRIGGER log_leaves_no_update_delete BEFORE UPDATE OR DELETE ON "log_leaves" FOR EACH ROW EXECUTE FUNCTION gusset_refuse_change();
--> statement-breakpoint
CREATE TRIGGER log_leaves_no_truncate BEFORE TRUNCATE ON "log_leaves" FOR EACH STATEMENT EXECUTE FUNCTION gusset_refuse_change();
--> statement-breakpoint
CREATE TRIGGER log_positions_no_update_delete BEFORE UPDATE OR DELETE ON "log_positions" FOR EACH ROW EXECUTE FUNCTION gusset_refuse_change();
--> statement-breakpoint
CREATE TRIGGER log_positions_no_truncate BEFORE TRUNCATE ON "log_positions" FOR EACH STATEMENT EXECUTE FUNCTION gusset_refuse_change();
--> statement-breakpoint
CREATE TRIGGER log_nodes_no_update_delete BEFORE UPDATE OR DELETE ON "log_nodes" FOR EACH ROW EXECUTE FUNCTION gusset_refuse_change();
--> statement-breakpoint
CREATE TRIGGER log_nodes_no_truncate BEFORE TRUNCATE ON "log_nodes" FOR EACH STATEMENT EXECUTE FUNCTION gusset_refuse_change();
--> statement-breakpoint
CREATE TRIGGER log_tree_heads_no_update_delete BEFORE UPDATE OR DELETE ON "log_tree_heads" FOR EACH ROW EXECUTE FUNCTION gusset_refuse_change();
--> statement-breakpoint
CREATE TRIGGER log_tree_heads_no_truncate BEFORE TRUNCATE ON "log_tree_heads" FOR EACH STATEMENT EXECUTE FUNCTION gusset_refuse_change();
