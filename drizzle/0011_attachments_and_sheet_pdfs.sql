CREATE TABLE "calc_sheet_pdfs" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"run_id" uuid NOT NULL,
	"state_sha256" text NOT NULL,
	"sha256" text NOT NULL,
	"bytes" integer NOT NULL,
	"pages" integer NOT NULL,
	"rendered_by_id" text NOT NULL,
	"rendered_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "calc_sheet_pdfs_run_state_unique" UNIQUE("run_id","state_sha256"),
	CONSTRAINT "calc_sheet_pdfs_sha256_check" CHECK ("calc_sheet_pdfs"."sha256" ~ '^[0-9a-f]{64}$' and "calc_sheet_pdfs"."state_sha256" ~ '^[0-9a-f]{64}$'),
	CONSTRAINT "calc_sheet_pdfs_bytes_check" CHECK ("calc_sheet_pdfs"."bytes" > 0 and "calc_sheet_pdfs"."pages" > 0)
);
--> statement-breakpoint
CREATE TABLE "job_attachments" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"job_id" uuid NOT NULL,
	"run_id" uuid,
	"sha256" text NOT NULL,
	"file_name" text NOT NULL,
	"content_type" text NOT NULL,
	"bytes" integer NOT NULL,
	"note" text,
	"uploaded_by_id" text NOT NULL,
	"uploaded_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "job_attachments_place_sha256_unique" UNIQUE NULLS NOT DISTINCT("job_id","run_id","sha256"),
	CONSTRAINT "job_attachments_sha256_check" CHECK ("job_attachments"."sha256" ~ '^[0-9a-f]{64}$'),
	CONSTRAINT "job_attachments_bytes_check" CHECK ("job_attachments"."bytes" > 0),
	CONSTRAINT "job_attachments_content_type_check" CHECK ("job_attachments"."content_type" in ('application/pdf', 'image/png', 'image/jpeg', 'image/webp'))
);
--> statement-breakpoint
ALTER TABLE "calc_sheet_pdfs" ADD CONSTRAINT "calc_sheet_pdfs_run_id_runs_id_fk" FOREIGN KEY ("run_id") REFERENCES "public"."runs"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "calc_sheet_pdfs" ADD CONSTRAINT "calc_sheet_pdfs_rendered_by_id_user_id_fk" FOREIGN KEY ("rendered_by_id") REFERENCES "public"."user"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "job_attachments" ADD CONSTRAINT "job_attachments_job_id_jobs_id_fk" FOREIGN KEY ("job_id") REFERENCES "public"."jobs"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "job_attachments" ADD CONSTRAINT "job_attachments_run_id_runs_id_fk" FOREIGN KEY ("run_id") REFERENCES "public"."runs"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "job_attachments" ADD CONSTRAINT "job_attachments_uploaded_by_id_user_id_fk" FOREIGN KEY ("uploaded_by_id") REFERENCES "public"."user"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "calc_sheet_pdfs_run_idx" ON "calc_sheet_pdfs" USING btree ("run_id","rendered_at");--> statement-breakpoint
CREATE INDEX "job_attachments_run_idx" ON "job_attachments" USING btree ("run_id");--> statement-breakpoint
-- Attachments and the calc sheet PDFs are evidence: append-only for every role (gusset_refuse_change is defined in
-- 0006; scripts/lib/app-privileges.ts then grants the app's role only SELECT and INSERT on these tables).
CREATE TRIGGER job_attachments_no_update_delete BEFORE UPDATE OR DELETE ON "job_attachments"
  FOR EACH ROW EXECUTE FUNCTION gusset_refuse_change();
--> statement-breakpoint
CREATE TRIGGER job_attachments_no_truncate BEFORE TRUNCATE ON "job_attachments"
  FOR EACH STATEMENT EXECUTE FUNCTION gusset_refuse_change();
--> statement-breakpoint
CREATE TRIGGER calc_sheet_pdfs_no_update_delete BEFORE UPDATE OR DELETE ON "calc_sheet_pdfs"
  FOR EACH ROW EXECUTE FUNCTION gusset_refuse_change();
--> statement-breakpoint
CREATE TRIGGER calc_sheet_pdfs_no_truncate BEFORE TRUNCATE ON "calc_sheet_pdfs"
  FOR EACH STATEMENT EXECUTE FUNCTION gusset_refuse_change();
