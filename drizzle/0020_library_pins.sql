ALTER TABLE "library_versions" ADD CONSTRAINT "library_versions_id_library_unique" UNIQUE("id","library_id");--> statement-breakpoint
CREATE TABLE "standard_version_library_pins" (
	"standard_version_id" uuid NOT NULL,
	"library_id" uuid NOT NULL,
	"library_version_id" uuid NOT NULL,
	"pinned_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "standard_version_library_pins_standard_version_id_library_id_pk" PRIMARY KEY("standard_version_id","library_id")
);
--> statement-breakpoint
ALTER TABLE "standard_version_library_pins" ADD CONSTRAINT "standard_version_library_pins_standard_version_id_standard_versions_id_fk" FOREIGN KEY ("standard_version_id") REFERENCES "public"."standard_versions"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "standard_version_library_pins" ADD CONSTRAINT "standard_version_library_pins_library_id_libraries_id_fk" FOREIGN KEY ("library_id") REFERENCES "public"."libraries"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "standard_version_library_pins" ADD CONSTRAINT "standard_version_library_pins_version_fk" FOREIGN KEY ("library_version_id","library_id") REFERENCES "public"."library_versions"("id","library_id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "standard_version_library_pins_version_idx" ON "standard_version_library_pins" USING btree ("library_version_id");--> statement-breakpoint
-- hand-written:
-- A pin is evidence of what a published version runs on: append-only for every role (gusset_refuse_change is defined
-- in 0006; scripts/lib/app-privileges.ts then grants the app's role only SELECT and INSERT on this table). The unique
-- constraint on library_versions above is moved before the pin's foreign key, which needs it.
CREATE TRIGGER standard_version_library_pins_no_update_delete BEFORE UPDATE OR DELETE ON "standard_version_library_pins"
  FOR EACH ROW EXECUTE FUNCTION gusset_refuse_change();
--> statement-breakpoint
CREATE TRIGGER standard_version_library_pins_no_truncate BEFORE TRUNCATE ON "standard_version_library_pins"
  FOR EACH STATEMENT EXECUTE FUNCTION gusset_refuse_change();
