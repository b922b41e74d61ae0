-- Jobs take the trade's name, and gain a site, the responsible engineer who approves their calcs, and a status.
ALTER TABLE "projects" RENAME TO "jobs";--> statement-breakpoint
ALTER TABLE "jobs" RENAME CONSTRAINT "projects_job_number_unique" TO "jobs_job_number_unique";--> statement-breakpoint
ALTER TABLE "jobs" RENAME CONSTRAINT "projects_pkey" TO "jobs_pkey";--> statement-breakpoint
ALTER TABLE "jobs" RENAME CONSTRAINT "projects_created_by_id_user_id_fk" TO "jobs_created_by_id_user_id_fk";--> statement-breakpoint
ALTER TABLE "jobs" ADD COLUMN "site" text;--> statement-breakpoint
ALTER TABLE "jobs" ADD COLUMN "responsible_engineer_id" text;--> statement-breakpoint
ALTER TABLE "jobs" ADD COLUMN "status" text DEFAULT 'active' NOT NULL;--> statement-breakpoint
ALTER TABLE "jobs" ADD COLUMN "updated_at" timestamp with time zone DEFAULT now() NOT NULL;--> statement-breakpoint
UPDATE "jobs" SET "responsible_engineer_id" = "created_by_id", "updated_at" = "created_at";--> statement-breakpoint
ALTER TABLE "jobs" ADD CONSTRAINT "jobs_responsible_engineer_id_user_id_fk" FOREIGN KEY ("responsible_engineer_id") REFERENCES "public"."user"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "jobs" ADD CONSTRAINT "jobs_status_check" CHECK ("jobs"."status" in ('active', 'on-hold', 'closed'));--> statement-breakpoint
CREATE TABLE "runs" (
	"id" uuid PRIMARY KEY NOT NULL,
	"job_id" uuid NOT NULL,
	"version_id" uuid NOT NULL,
	"outcome" text NOT NULL,
	"pass" boolean,
	"max_utilisation" double precision,
	"purpose" text DEFAULT 'design' NOT NULL,
	"parent_run_id" uuid,
	"unit_system" text NOT NULL,
	"record" text NOT NULL,
	"record_sha256" text NOT NULL,
	"record_bytes" integer NOT NULL,
	"created_by_id" text NOT NULL,
	"created_at" timestamp with time zone NOT NULL,
	CONSTRAINT "runs_outcome_check" CHECK ("runs"."outcome" in ('succeeded', 'failed')),
	CONSTRAINT "runs_purpose_check" CHECK ("runs"."purpose" in ('design', 'remediation')),
	CONSTRAINT "runs_unit_system_check" CHECK ("runs"."unit_system" in ('si', 'us')),
	CONSTRAINT "runs_pass_check" CHECK (("runs"."outcome" = 'failed') = ("runs"."pass" is null)),
	CONSTRAINT "runs_sha256_check" CHECK ("runs"."record_sha256" ~ '^[0-9a-f]{64}$')
);
--> statement-breakpoint
CREATE TABLE "run_library_entries" (
	"run_id" uuid NOT NULL,
	"input_key" text NOT NULL,
	"entry_id" uuid NOT NULL,
	"entry_hash" text NOT NULL,
	CONSTRAINT "run_library_entries_run_id_input_key_pk" PRIMARY KEY("run_id","input_key")
);
--> statement-breakpoint
ALTER TABLE "runs" ADD CONSTRAINT "runs_job_id_jobs_id_fk" FOREIGN KEY ("job_id") REFERENCES "public"."jobs"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "runs" ADD CONSTRAINT "runs_version_id_standard_versions_id_fk" FOREIGN KEY ("version_id") REFERENCES "public"."standard_versions"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "runs" ADD CONSTRAINT "runs_parent_run_id_runs_id_fk" FOREIGN KEY ("parent_run_id") REFERENCES "public"."runs"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "runs" ADD CONSTRAINT "runs_created_by_id_user_id_fk" FOREIGN KEY ("created_by_id") REFERENCES "public"."user"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "run_library_entries" ADD CONSTRAINT "run_library_entries_run_id_runs_id_fk" FOREIGN KEY ("run_id") REFERENCES "public"."runs"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "run_library_entries" ADD CONSTRAINT "run_library_entries_entry_id_library_version_entries_id_fk" FOREIGN KEY ("entry_id") REFERENCES "public"."library_version_entries"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "runs_job_created_idx" ON "runs" USING btree ("job_id","created_at" DESC NULLS LAST,"id" DESC NULLS LAST);--> statement-breakpoint
CREATE INDEX "runs_version_idx" ON "runs" USING btree ("version_id","created_at" DESC NULLS LAST);--> statement-breakpoint
CREATE INDEX "runs_created_idx" ON "runs" USING btree ("created_at" DESC NULLS LAST,"id" DESC NULLS LAST);--> statement-breakpoint
CREATE INDEX "runs_person_idx" ON "runs" USING btree ("created_by_id","created_at" DESC NULLS LAST);--> statement-breakpoint
CREATE INDEX "run_library_entries_entry_idx" ON "run_library_entries" USING btree ("entry_id");--> statement-breakpoint
-- A run is a record for good: the database refuses to change or delete one, or the entries it used, for every
-- role (gusset_refuse_change is defined in 0006; scripts/lib/app-privileges.ts then grants the app's role only
-- SELECT and INSERT on these tables).
CREATE TRIGGER runs_no_update_delete BEFORE UPDATE OR DELETE ON "runs"
  FOR EACH ROW EXECUTE FUNCTION gusset_refuse_change();
--> statement-breakpoint
CREATE TRIGGER runs_no_truncate BEFORE TRUNCATE ON "runs"
  FOR EACH STATEMENT EXECUTE FUNCTION gusset_refuse_change();
--> statement-breakpoint
CREATE TRIGGER run_library_entries_no_update_delete BEFORE UPDATE OR DELETE ON "run_library_entries"
  FOR EACH ROW EXECUTE FUNCTION gusset_refuse_change();
--> statement-breakpoint
CREATE TRIGGER run_library_entries_no_truncate BEFORE TRUNCATE ON "run_library_entries"
  FOR EACH STATEMENT EXECUTE FUNCTION gusset_refuse_change();
