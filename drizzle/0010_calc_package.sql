CREATE TABLE "calc_revision_events" (
	"id" bigserial PRIMARY KEY NOT NULL,
	"revision_id" uuid NOT NULL,
	"kind" text NOT NULL,
	"issue_status" text,
	"actor_id" text,
	"note" text,
	"reason" text,
	"occurred_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "calc_revision_events_kind_check" CHECK ("calc_revision_events"."kind" in ('prepared', 'checked', 'returned', 'approved', 'status', 'superseded')),
	CONSTRAINT "calc_revision_events_status_check" CHECK ("calc_revision_events"."issue_status" is null or "calc_revision_events"."issue_status" in ('preliminary', 'for-approval', 'for-construction', 'superseded')),
	CONSTRAINT "calc_revision_events_return_note" CHECK ("calc_revision_events"."kind" <> 'returned' or length(btrim(coalesce("calc_revision_events"."note", ''))) > 0)
);
--> statement-breakpoint
CREATE TABLE "calc_revisions" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"calc_id" uuid NOT NULL,
	"letter" text NOT NULL,
	"run_id" uuid NOT NULL,
	"preparer_id" text NOT NULL,
	"checker_id" text NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "calc_revisions_letter_unique" UNIQUE("calc_id","letter"),
	CONSTRAINT "calc_revisions_letter_check" CHECK ("calc_revisions"."letter" ~ '^[A-Z]{1,2}$'),
	CONSTRAINT "calc_revisions_four_eyes" CHECK ("calc_revisions"."checker_id" <> "calc_revisions"."preparer_id")
);
--> statement-breakpoint
CREATE TABLE "calcs" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"job_id" uuid NOT NULL,
	"number" text NOT NULL,
	"title" text NOT NULL,
	"created_by_id" text NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "calcs_job_number_unique" UNIQUE("job_id","number")
);
--> statement-breakpoint
ALTER TABLE "calc_revision_events" ADD CONSTRAINT "calc_revision_events_revision_id_calc_revisions_id_fk" FOREIGN KEY ("revision_id") REFERENCES "public"."calc_revisions"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "calc_revision_events" ADD CONSTRAINT "calc_revision_events_actor_id_user_id_fk" FOREIGN KEY ("actor_id") REFERENCES "public"."user"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "calc_revisions" ADD CONSTRAINT "calc_revisions_calc_id_calcs_id_fk" FOREIGN KEY ("calc_id") REFERENCES "public"."calcs"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "calc_revisions" ADD CONSTRAINT "calc_revisions_run_id_runs_id_fk" FOREIGN KEY ("run_id") REFERENCES "public"."runs"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "calc_revisions" ADD CONSTRAINT "calc_revisions_preparer_id_user_id_fk" FOREIGN KEY ("preparer_id") REFERENCES "public"."user"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "calc_revisions" ADD CONSTRAINT "calc_revisions_checker_id_user_id_fk" FOREIGN KEY ("checker_id") REFERENCES "public"."user"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "calcs" ADD CONSTRAINT "calcs_job_id_jobs_id_fk" FOREIGN KEY ("job_id") REFERENCES "public"."jobs"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "calcs" ADD CONSTRAINT "calcs_created_by_id_user_id_fk" FOREIGN KEY ("created_by_id") REFERENCES "public"."user"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "calc_revision_events_revision_idx" ON "calc_revision_events" USING btree ("revision_id","id");--> statement-breakpoint
CREATE INDEX "calc_revisions_run_idx" ON "calc_revisions" USING btree ("run_id");--> statement-breakpoint
-- A calc package is a record of sign-off: calcs, their revisions and every step on them are append-only for every
-- role (gusset_refuse_change is defined in 0006; scripts/lib/app-privileges.ts then grants the app's role only
-- SELECT and INSERT on these tables).
CREATE TRIGGER calcs_no_update_delete BEFORE UPDATE OR DELETE ON "calcs"
  FOR EACH ROW EXECUTE FUNCTION gusset_refuse_change();
--> statement-breakpoint
CREATE TRIGGER calcs_no_truncate BEFORE TRUNCATE ON "calcs"
  FOR EACH STATEMENT EXECUTE FUNCTION gusset_refuse_change();
--> statement-breakpoint
CREATE TRIGGER calc_revisions_no_update_delete BEFORE UPDATE OR DELETE ON "calc_revisions"
  FOR EACH ROW EXECUTE FUNCTION gusset_refuse_change();
--> statement-breakpoint
CREATE TRIGGER calc_revisions_no_truncate BEFORE TRUNCATE ON "calc_revisions"
  FOR EACH STATEMENT EXECUTE FUNCTION gusset_refuse_change();
--> statement-breakpoint
CREATE TRIGGER calc_revision_events_no_update_delete BEFORE UPDATE OR DELETE ON "calc_revision_events"
  FOR EACH ROW EXECUTE FUNCTION gusset_refuse_change();
--> statement-breakpoint
CREATE TRIGGER calc_revision_events_no_truncate BEFORE TRUNCATE ON "calc_revision_events"
  FOR EACH STATEMENT EXECUTE FUNCTION gusset_refuse_change();
