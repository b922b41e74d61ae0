CREATE TABLE "calc_sheet_pdf_keys" (
	"run_id" uuid NOT NULL,
	"sheet_key" text NOT NULL,
	"pdf_id" uuid NOT NULL,
	"kept_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "calc_sheet_pdf_keys_pkey" PRIMARY KEY("run_id","sheet_key"),
	CONSTRAINT "calc_sheet_pdf_keys_key_check" CHECK ("calc_sheet_pdf_keys"."sheet_key" ~ '^[0-9a-f]{64}$')
);
--> statement-breakpoint
ALTER TABLE "calc_sheet_pdf_keys" ADD CONSTRAINT "calc_sheet_pdf_keys_run_id_runs_id_fk" FOREIGN KEY ("run_id") REFERENCES "public"."runs"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "calc_sheet_pdf_keys" ADD CONSTRAINT "calc_sheet_pdf_keys_pdf_id_calc_sheet_pdfs_id_fk" FOREIGN KEY ("pdf_id") REFERENCES "public"."calc_sheet_pdfs"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "calc_sheet_pdf_keys_pdf_idx" ON "calc_sheet_pdf_keys" USING btree ("pdf_id");--> statement-breakpoint
-- hand-written:
-- A sheet key, once it names a kept PDF, names it for good: append-only for every role (gusset_refuse_change is
-- defined in 0006; scripts/lib/app-privileges.ts then grants the app's role only SELECT and INSERT here).
CREATE TRIGGER calc_sheet_pdf_keys_no_update_delete BEFORE UPDATE OR DELETE ON "calc_sheet_pdf_keys"
  FOR EACH ROW EXECUTE FUNCTION gusset_refuse_change();
--> statement-breakpoint
CREATE TRIGGER calc_sheet_pdf_keys_no_truncate BEFORE TRUNCATE ON "calc_sheet_pdf_keys"
  FOR EACH STATEMENT EXECUTE FUNCTION gusset_refuse_change();
