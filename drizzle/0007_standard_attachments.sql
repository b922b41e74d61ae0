CREATE TABLE "standard_attachments" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"standard_id" uuid NOT NULL,
	"sha256" text NOT NULL,
	"file_name" text NOT NULL,
	"content_type" text NOT NULL,
	"bytes" integer NOT NULL,
	"uploaded_by_id" text NOT NULL,
	"uploaded_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "standard_attachments_standard_sha256_unique" UNIQUE("standard_id","sha256"),
	CONSTRAINT "standard_attachments_sha256_check" CHECK ("standard_attachments"."sha256" ~ '^[0-9a-f]{64}$'),
	CONSTRAINT "standard_attachments_bytes_check" CHECK ("standard_attachments"."bytes" > 0),
	CONSTRAINT "standard_attachments_content_type_check" CHECK ("standard_attachments"."content_type" in ('application/pdf', 'image/png', 'image/jpeg'))
);
--> statement-breakpoint
ALTER TABLE "standard_attachments" ADD CONSTRAINT "standard_attachments_standard_id_standards_id_fk" FOREIGN KEY ("standard_id") REFERENCES "public"."standards"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "standard_attachments" ADD CONSTRAINT "standard_attachments_uploaded_by_id_user_id_fk" FOREIGN KEY ("uploaded_by_id") REFERENCES "public"."user"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
-- A file a published version cites is its evidence: attachments are append-only, like the versions
-- (gusset_refuse_change is defined in 0006; scripts/lib/app-privileges.ts grants the app's role only
-- SELECT and INSERT on a table with these triggers).
CREATE TRIGGER standard_attachments_no_update_delete BEFORE UPDATE OR DELETE ON "standard_attachments"
  FOR EACH ROW EXECUTE FUNCTION gusset_refuse_change();
--> statement-breakpoint
CREATE TRIGGER standard_attachments_no_truncate BEFORE TRUNCATE ON "standard_attachments"
  FOR EACH STATEMENT EXECUTE FUNCTION gusset_refuse_change();
