CREATE TABLE "rerun_batch_items" (
	"id" bigserial PRIMARY KEY NOT NULL,
	"batch_id" uuid NOT NULL,
	"original_run_id" uuid NOT NULL,
	"new_run_id" uuid,
	"status" text NOT NULL,
	"message" text,
	"pass_before" boolean,
	"pass_after" boolean,
	"utilisation_before" double precision,
	"utilisation_after" double precision,
	"newly_failing" integer DEFAULT 0 NOT NULL,
	"checks" jsonb NOT NULL,
	"finished_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "rerun_batch_items_new_run_id_unique" UNIQUE("new_run_id"),
	CONSTRAINT "rerun_batch_items_batch_run_unique" UNIQUE("batch_id","original_run_id"),
	CONSTRAINT "rerun_batch_items_status_check" CHECK ("rerun_batch_items"."status" in ('succeeded', 'failed')),
	CONSTRAINT "rerun_batch_items_failure_check" CHECK ("rerun_batch_items"."status" = 'failed' or "rerun_batch_items"."new_run_id" is not null)
);
--> statement-breakpoint
CREATE TABLE "rerun_batches" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"withdrawal_id" uuid NOT NULL,
	"mapping_id" uuid NOT NULL,
	"total" integer NOT NULL,
	"started_by_id" text NOT NULL,
	"started_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "rerun_batches_mapping_id_unique" UNIQUE("mapping_id"),
	CONSTRAINT "rerun_batches_total_check" CHECK ("rerun_batches"."total" >= 0)
);
--> statement-breakpoint
CREATE TABLE "withdrawal_mappings" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"withdrawal_id" uuid NOT NULL,
	"successor_version_id" uuid,
	"replacement_entry_key" text,
	"mapping" jsonb NOT NULL,
	"declared_by_id" text NOT NULL,
	"declared_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "withdrawal_outcomes" (
	"id" bigserial PRIMARY KEY NOT NULL,
	"withdrawal_id" uuid NOT NULL,
	"revision_id" uuid NOT NULL,
	"kind" text NOT NULL,
	"reason" text,
	"new_revision_id" uuid,
	"reference" text,
	"actor_id" text NOT NULL,
	"occurred_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "withdrawal_outcomes_kind_check" CHECK ("withdrawal_outcomes"."kind" in ('no-action', 'rerun-checked', 'drawings-revised')),
	CONSTRAINT "withdrawal_outcomes_evidence_check" CHECK (("withdrawal_outcomes"."kind" <> 'no-action' or length(btrim(coalesce("withdrawal_outcomes"."reason", ''))) > 0)
       and ("withdrawal_outcomes"."kind" <> 'rerun-checked' or "withdrawal_outcomes"."new_revision_id" is not null)
       and ("withdrawal_outcomes"."kind" <> 'drawings-revised' or length(btrim(coalesce("withdrawal_outcomes"."reference", ''))) > 0))
);
--> statement-breakpoint
CREATE TABLE "withdrawals" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"subject" text NOT NULL,
	"standard_version_id" uuid,
	"library_version_id" uuid,
	"library_entry_id" uuid,
	"reason" text NOT NULL,
	"actor_id" text,
	"occurred_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "withdrawals_standard_version_id_unique" UNIQUE("standard_version_id"),
	CONSTRAINT "withdrawals_library_version_id_unique" UNIQUE("library_version_id"),
	CONSTRAINT "withdrawals_library_entry_id_unique" UNIQUE("library_entry_id"),
	CONSTRAINT "withdrawals_subject_check" CHECK (("withdrawals"."subject" = 'standard-version' and "withdrawals"."standard_version_id" is not null and "withdrawals"."library_version_id" is null and "withdrawals"."library_entry_id" is null)
       or ("withdrawals"."subject" = 'library-version' and "withdrawals"."library_version_id" is not null and "withdrawals"."standard_version_id" is null and "withdrawals"."library_entry_id" is null)
       or ("withdrawals"."subject" = 'library-entry' and "withdrawals"."library_entry_id" is not null and "withdrawals"."standard_version_id" is null and "withdrawals"."library_version_id" is null)),
	CONSTRAINT "withdrawals_reason_check" CHECK (length(btrim("withdrawals"."reason")) > 0)
);
--> statement-breakpoint
ALTER TABLE "rerun_batch_items" ADD CONSTRAINT "rerun_batch_items_batch_id_rerun_batches_id_fk" FOREIGN KEY ("batch_id") REFERENCES "public"."rerun_batches"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "rerun_batch_items" ADD CONSTRAINT "rerun_batch_items_original_run_id_runs_id_fk" FOREIGN KEY ("original_run_id") REFERENCES "public"."runs"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "rerun_batch_items" ADD CONSTRAINT "rerun_batch_items_new_run_id_runs_id_fk" FOREIGN KEY ("new_run_id") REFERENCES "public"."runs"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "rerun_batches" ADD CONSTRAINT "rerun_batches_withdrawal_id_withdrawals_id_fk" FOREIGN KEY ("withdrawal_id") REFERENCES "public"."withdrawals"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "rerun_batches" ADD CONSTRAINT "rerun_batches_mapping_id_withdrawal_mappings_id_fk" FOREIGN KEY ("mapping_id") REFERENCES "public"."withdrawal_mappings"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "rerun_batches" ADD CONSTRAINT "rerun_batches_started_by_id_user_id_fk" FOREIGN KEY ("started_by_id") REFERENCES "public"."user"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "withdrawal_mappings" ADD CONSTRAINT "withdrawal_mappings_withdrawal_id_withdrawals_id_fk" FOREIGN KEY ("withdrawal_id") REFERENCES "public"."withdrawals"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "withdrawal_mappings" ADD CONSTRAINT "withdrawal_mappings_successor_version_id_standard_versions_id_fk" FOREIGN KEY ("successor_version_id") REFERENCES "public"."standard_versions"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "withdrawal_mappings" ADD CONSTRAINT "withdrawal_mappings_declared_by_id_user_id_fk" FOREIGN KEY ("declared_by_id") REFERENCES "public"."user"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "withdrawal_outcomes" ADD CONSTRAINT "withdrawal_outcomes_withdrawal_id_withdrawals_id_fk" FOREIGN KEY ("withdrawal_id") REFERENCES "public"."withdrawals"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "withdrawal_outcomes" ADD CONSTRAINT "withdrawal_outcomes_revision_id_calc_revisions_id_fk" FOREIGN KEY ("revision_id") REFERENCES "public"."calc_revisions"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "withdrawal_outcomes" ADD CONSTRAINT "withdrawal_outcomes_new_revision_id_calc_revisions_id_fk" FOREIGN KEY ("new_revision_id") REFERENCES "public"."calc_revisions"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "withdrawal_outcomes" ADD CONSTRAINT "withdrawal_outcomes_actor_id_user_id_fk" FOREIGN KEY ("actor_id") REFERENCES "public"."user"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "withdrawals" ADD CONSTRAINT "withdrawals_standard_version_id_standard_versions_id_fk" FOREIGN KEY ("standard_version_id") REFERENCES "public"."standard_versions"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "withdrawals" ADD CONSTRAINT "withdrawals_library_version_id_library_versions_id_fk" FOREIGN KEY ("library_version_id") REFERENCES "public"."library_versions"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "withdrawals" ADD CONSTRAINT "withdrawals_library_entry_id_library_version_entries_id_fk" FOREIGN KEY ("library_entry_id") REFERENCES "public"."library_version_entries"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "withdrawals" ADD CONSTRAINT "withdrawals_actor_id_user_id_fk" FOREIGN KEY ("actor_id") REFERENCES "public"."user"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "rerun_batches_withdrawal_idx" ON "rerun_batches" USING btree ("withdrawal_id","started_at");--> statement-breakpoint
CREATE INDEX "withdrawal_mappings_withdrawal_idx" ON "withdrawal_mappings" USING btree ("withdrawal_id","declared_at");--> statement-breakpoint
CREATE INDEX "withdrawal_outcomes_withdrawal_idx" ON "withdrawal_outcomes" USING btree ("withdrawal_id","revision_id","id");--> statement-breakpoint
CREATE INDEX "withdrawals_occurred_idx" ON "withdrawals" USING btree ("occurred_at" DESC NULLS LAST);--> statement-breakpoint
-- hand-written:
-- Withdrawals, their mappings and outcomes, and batch re-runs are evidence: append-only for every role
-- (gusset_refuse_change is defined in 0006; scripts/lib/app-privileges.ts then grants the app's role only SELECT and
-- INSERT on these tables).
CREATE TRIGGER withdrawals_no_update_delete BEFORE UPDATE OR DELETE ON "withdrawals"
  FOR EACH ROW EXECUTE FUNCTION gusset_refuse_change();
--> statement-breakpoint
CREATE TRIGGER withdrawals_no_truncate BEFORE TRUNCATE ON "withdrawals"
  FOR EACH STATEMENT EXECUTE FUNCTION gusset_refuse_change();
--> statement-breakpoint
CREATE TRIGGER withdrawal_mappings_no_update_delete BEFORE UPDATE OR DELETE ON "withdrawal_mappings"
  FOR EACH ROW EXECUTE FUNCTION gusset_refuse_change();
--> statement-breakpoint
CREATE TRIGGER withdrawal_mappings_no_truncate BEFORE TRUNCATE ON "withdrawal_mappings"
  FOR EACH STATEMENT EXECUTE FUNCTION gusset_refuse_change();
--> statement-breakpoint
CREATE TRIGGER withdrawal_outcomes_no_update_delete BEFORE UPDATE OR DELETE ON "withdrawal_outcomes"
  FOR EACH ROW EXECUTE FUNCTION gusset_refuse_change();
--> statement-breakpoint
CREATE TRIGGER withdrawal_outcomes_no_truncate BEFORE TRUNCATE ON "withdrawal_outcomes"
  FOR EACH STATEMENT EXECUTE FUNCTION gusset_refuse_change();
--> statement-breakpoint
CREATE TRIGGER rerun_batches_no_update_delete BEFORE UPDATE OR DELETE ON "rerun_batches"
  FOR EACH ROW EXECUTE FUNCTION gusset_refuse_change();
--> statement-breakpoint
CREATE TRIGGER rerun_batches_no_truncate BEFORE TRUNCATE ON "rerun_batches"
  FOR EACH STATEMENT EXECUTE FUNCTION gusset_refuse_change();
--> statement-breakpoint
CREATE TRIGGER rerun_batch_items_no_update_delete BEFORE UPDATE OR DELETE ON "rerun_batch_items"
  FOR EACH ROW EXECUTE FUNCTION gusset_refuse_change();
--> statement-breakpoint
CREATE TRIGGER rerun_batch_items_no_truncate BEFORE TRUNCATE ON "rerun_batch_items"
  FOR EACH STATEMENT EXECUTE FUNCTION gusset_refuse_change();
--> statement-breakpoint
-- Withdrawals made before this table existed, from their events, so every withdrawn thing has its impact report.
INSERT INTO "withdrawals" ("subject", "standard_version_id", "reason", "actor_id", "occurred_at")
SELECT DISTINCT ON (e."version_id") 'standard-version', e."version_id", coalesce(nullif(btrim(e."reason"), ''), 'No reason was recorded.'),
  e."actor_id", e."occurred_at"
FROM "standard_version_events" e WHERE e."kind" = 'withdrawn' ORDER BY e."version_id", e."id";
--> statement-breakpoint
INSERT INTO "withdrawals" ("subject", "library_version_id", "reason", "actor_id", "occurred_at")
SELECT DISTINCT ON (e."version_id") 'library-version', e."version_id", e."reason", e."actor_id", e."occurred_at"
FROM "library_version_events" e WHERE e."kind" = 'withdrawn' AND e."entry_key" IS NULL ORDER BY e."version_id", e."id";
--> statement-breakpoint
INSERT INTO "withdrawals" ("subject", "library_entry_id", "reason", "actor_id", "occurred_at")
SELECT DISTINCT ON (n."id") 'library-entry', n."id", e."reason", e."actor_id", e."occurred_at"
FROM "library_version_events" e
JOIN "library_version_entries" n ON n."version_id" = e."version_id" AND n."normalised_key" = e."entry_key"
WHERE e."kind" = 'withdrawn' ORDER BY n."id", e."id";
--> statement-breakpoint
-- The batch re-run queue (pg-boss 10), as scripts/job-queue-sql.ts prints it for lib/jobs/queues.ts's policy.
SELECT pgboss.create_queue('rerun.item', '{"policy":"standard","retryLimit":10,"retryDelay":2,"retryBackoff":false,"expireInSeconds":45}');
