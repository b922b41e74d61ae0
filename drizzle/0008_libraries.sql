CREATE TABLE "libraries" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"slug" text NOT NULL,
	"kind" text NOT NULL,
	"created_by_id" text,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "libraries_slug_unique" UNIQUE("slug"),
	CONSTRAINT "libraries_kind_check" CHECK ("libraries"."kind" in ('sections', 'materials', 'combinations'))
);
--> statement-breakpoint
CREATE TABLE "library_drafts" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"library_id" uuid NOT NULL,
	"based_on_version_id" uuid,
	"author_id" text NOT NULL,
	"document" jsonb NOT NULL,
	"state" text DEFAULT 'editing' NOT NULL,
	"published_version_id" uuid,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "library_drafts_state_check" CHECK ("library_drafts"."state" in ('editing', 'in-review', 'published', 'discarded'))
);
--> statement-breakpoint
CREATE TABLE "library_review_comments" (
	"id" bigserial PRIMARY KEY NOT NULL,
	"review_id" uuid NOT NULL,
	"entry_key" text,
	"body" text NOT NULL,
	"author_id" text NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "library_reviews" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"draft_id" uuid NOT NULL,
	"round" integer NOT NULL,
	"document" jsonb NOT NULL,
	"content_hash" text NOT NULL,
	"changelog" text NOT NULL,
	"submitted_by_id" text NOT NULL,
	"submitted_at" timestamp with time zone DEFAULT now() NOT NULL,
	"reviewer_id" text,
	"outcome" text,
	"note" text,
	"decided_at" timestamp with time zone,
	CONSTRAINT "library_reviews_round_unique" UNIQUE("draft_id","round"),
	CONSTRAINT "library_reviews_hash_check" CHECK ("library_reviews"."content_hash" ~ '^[0-9a-f]{64}$'),
	CONSTRAINT "library_reviews_outcome_check" CHECK ("library_reviews"."outcome" is null or "library_reviews"."outcome" in ('returned', 'approved')),
	CONSTRAINT "library_reviews_four_eyes" CHECK ("library_reviews"."reviewer_id" is null or "library_reviews"."reviewer_id" <> "library_reviews"."submitted_by_id")
);
--> statement-breakpoint
CREATE TABLE "library_version_entries" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"version_id" uuid NOT NULL,
	"position" integer NOT NULL,
	"key" text NOT NULL,
	"normalised_key" text NOT NULL,
	"entry_hash" text NOT NULL,
	CONSTRAINT "library_version_entries_key_unique" UNIQUE("version_id","normalised_key"),
	CONSTRAINT "library_version_entries_position_unique" UNIQUE("version_id","position"),
	CONSTRAINT "library_version_entries_hash_check" CHECK ("library_version_entries"."entry_hash" ~ '^[0-9a-f]{64}$'),
	CONSTRAINT "library_version_entries_position_check" CHECK ("library_version_entries"."position" >= 0)
);
--> statement-breakpoint
CREATE TABLE "library_version_events" (
	"id" bigserial PRIMARY KEY NOT NULL,
	"version_id" uuid NOT NULL,
	"kind" text NOT NULL,
	"entry_key" text,
	"reason" text,
	"actor_id" text,
	"occurred_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "library_version_events_kind_check" CHECK ("library_version_events"."kind" in ('published', 'superseded', 'withdrawn')),
	CONSTRAINT "library_version_events_entry_check" CHECK ("library_version_events"."entry_key" is null or "library_version_events"."kind" = 'withdrawn'),
	CONSTRAINT "library_version_events_reason_check" CHECK ("library_version_events"."kind" <> 'withdrawn' or ("library_version_events"."reason" is not null and length(btrim("library_version_events"."reason")) > 0))
);
--> statement-breakpoint
CREATE TABLE "library_versions" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"library_id" uuid NOT NULL,
	"number" integer NOT NULL,
	"kind" text NOT NULL,
	"title" text NOT NULL,
	"document" jsonb NOT NULL,
	"content_hash" text NOT NULL,
	"changelog" text NOT NULL,
	"author_id" text NOT NULL,
	"reviewer_id" text NOT NULL,
	"based_on_version_id" uuid,
	"draft_id" uuid,
	"review_id" uuid,
	"published_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "library_versions_number_unique" UNIQUE("library_id","number"),
	CONSTRAINT "library_versions_number_check" CHECK ("library_versions"."number" >= 1),
	CONSTRAINT "library_versions_kind_check" CHECK ("library_versions"."kind" in ('sections', 'materials', 'combinations')),
	CONSTRAINT "library_versions_four_eyes" CHECK ("library_versions"."reviewer_id" <> "library_versions"."author_id"),
	CONSTRAINT "library_versions_hash_check" CHECK ("library_versions"."content_hash" ~ '^[0-9a-f]{64}$')
);
--> statement-breakpoint
ALTER TABLE "libraries" ADD CONSTRAINT "libraries_created_by_id_user_id_fk" FOREIGN KEY ("created_by_id") REFERENCES "public"."user"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "library_drafts" ADD CONSTRAINT "library_drafts_library_id_libraries_id_fk" FOREIGN KEY ("library_id") REFERENCES "public"."libraries"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "library_drafts" ADD CONSTRAINT "library_drafts_based_on_version_id_library_versions_id_fk" FOREIGN KEY ("based_on_version_id") REFERENCES "public"."library_versions"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "library_drafts" ADD CONSTRAINT "library_drafts_author_id_user_id_fk" FOREIGN KEY ("author_id") REFERENCES "public"."user"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "library_drafts" ADD CONSTRAINT "library_drafts_published_version_id_library_versions_id_fk" FOREIGN KEY ("published_version_id") REFERENCES "public"."library_versions"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "library_review_comments" ADD CONSTRAINT "library_review_comments_review_id_library_reviews_id_fk" FOREIGN KEY ("review_id") REFERENCES "public"."library_reviews"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "library_review_comments" ADD CONSTRAINT "library_review_comments_author_id_user_id_fk" FOREIGN KEY ("author_id") REFERENCES "public"."user"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "library_reviews" ADD CONSTRAINT "library_reviews_draft_id_library_drafts_id_fk" FOREIGN KEY ("draft_id") REFERENCES "public"."library_drafts"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "library_reviews" ADD CONSTRAINT "library_reviews_submitted_by_id_user_id_fk" FOREIGN KEY ("submitted_by_id") REFERENCES "public"."user"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "library_reviews" ADD CONSTRAINT "library_reviews_reviewer_id_user_id_fk" FOREIGN KEY ("reviewer_id") REFERENCES "public"."user"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "library_version_entries" ADD CONSTRAINT "library_version_entries_version_id_library_versions_id_fk" FOREIGN KEY ("version_id") REFERENCES "public"."library_versions"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "library_version_events" ADD CONSTRAINT "library_version_events_version_id_library_versions_id_fk" FOREIGN KEY ("version_id") REFERENCES "public"."library_versions"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "library_version_events" ADD CONSTRAINT "library_version_events_actor_id_user_id_fk" FOREIGN KEY ("actor_id") REFERENCES "public"."user"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "library_version_events" ADD CONSTRAINT "library_version_events_entry_fk" FOREIGN KEY ("version_id","entry_key") REFERENCES "public"."library_version_entries"("version_id","normalised_key") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "library_versions" ADD CONSTRAINT "library_versions_library_id_libraries_id_fk" FOREIGN KEY ("library_id") REFERENCES "public"."libraries"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "library_versions" ADD CONSTRAINT "library_versions_author_id_user_id_fk" FOREIGN KEY ("author_id") REFERENCES "public"."user"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "library_versions" ADD CONSTRAINT "library_versions_reviewer_id_user_id_fk" FOREIGN KEY ("reviewer_id") REFERENCES "public"."user"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "library_versions" ADD CONSTRAINT "library_versions_based_on_version_id_library_versions_id_fk" FOREIGN KEY ("based_on_version_id") REFERENCES "public"."library_versions"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "library_versions" ADD CONSTRAINT "library_versions_draft_id_library_drafts_id_fk" FOREIGN KEY ("draft_id") REFERENCES "public"."library_drafts"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "library_versions" ADD CONSTRAINT "library_versions_review_id_library_reviews_id_fk" FOREIGN KEY ("review_id") REFERENCES "public"."library_reviews"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "library_drafts_library_idx" ON "library_drafts" USING btree ("library_id");--> statement-breakpoint
CREATE INDEX "library_review_comments_review_idx" ON "library_review_comments" USING btree ("review_id");--> statement-breakpoint
CREATE INDEX "library_version_events_version_idx" ON "library_version_events" USING btree ("version_id","id");--> statement-breakpoint
-- A published library version, its entries and events, and the reviewers' comments are append-only, as the
-- standards' are (gusset_refuse_change is defined in 0006; scripts/lib/app-privileges.ts grants the app's role
-- only SELECT and INSERT on a table with these triggers).
CREATE TRIGGER library_versions_no_update_delete BEFORE UPDATE OR DELETE ON "library_versions"
  FOR EACH ROW EXECUTE FUNCTION gusset_refuse_change();
--> statement-breakpoint
CREATE TRIGGER library_versions_no_truncate BEFORE TRUNCATE ON "library_versions"
  FOR EACH STATEMENT EXECUTE FUNCTION gusset_refuse_change();
--> statement-breakpoint
CREATE TRIGGER library_version_entries_no_update_delete BEFORE UPDATE OR DELETE ON "library_version_entries"
  FOR EACH ROW EXECUTE FUNCTION gusset_refuse_change();
--> statement-breakpoint
CREATE TRIGGER library_version_entries_no_truncate BEFORE TRUNCATE ON "library_version_entries"
  FOR EACH STATEMENT EXECUTE FUNCTION gusset_refuse_change();
--> statement-breakpoint
CREATE TRIGGER library_version_events_no_update_delete BEFORE UPDATE OR DELETE ON "library_version_events"
  FOR EACH ROW EXECUTE FUNCTION gusset_refuse_change();
--> statement-breakpoint
CREATE TRIGGER library_version_events_no_truncate BEFORE TRUNCATE ON "library_version_events"
  FOR EACH STATEMENT EXECUTE FUNCTION gusset_refuse_change();
--> statement-breakpoint
CREATE TRIGGER library_review_comments_no_update_delete BEFORE UPDATE OR DELETE ON "library_review_comments"
  FOR EACH ROW EXECUTE FUNCTION gusset_refuse_change();
--> statement-breakpoint
CREATE TRIGGER library_review_comments_no_truncate BEFORE TRUNCATE ON "library_review_comments"
  FOR EACH STATEMENT EXECUTE FUNCTION gusset_refuse_change();
--> statement-breakpoint
-- A submission is decided once; what was submitted (document, changelog, who, when) never changes.
CREATE OR REPLACE FUNCTION gusset_guard_library_review() RETURNS trigger
LANGUAGE plpgsql AS $$
BEGIN
  IF TG_OP = 'DELETE' THEN
    RAISE EXCEPTION 'library_reviews: a submission is never deleted' USING ERRCODE = 'insufficient_privilege';
  END IF;
  IF OLD.outcome IS NOT NULL THEN
    RAISE EXCEPTION 'library_reviews: this submission was already decided (%)', OLD.outcome
      USING ERRCODE = 'insufficient_privilege';
  END IF;
  IF NEW.document IS DISTINCT FROM OLD.document OR NEW.changelog IS DISTINCT FROM OLD.changelog
     OR NEW.submitted_by_id IS DISTINCT FROM OLD.submitted_by_id OR NEW.submitted_at IS DISTINCT FROM OLD.submitted_at
     OR NEW.draft_id IS DISTINCT FROM OLD.draft_id OR NEW.round IS DISTINCT FROM OLD.round THEN
    RAISE EXCEPTION 'library_reviews: what was submitted does not change' USING ERRCODE = 'insufficient_privilege';
  END IF;
  RETURN NEW;
END;
$$;
--> statement-breakpoint
CREATE TRIGGER library_reviews_guard BEFORE UPDATE OR DELETE ON "library_reviews"
  FOR EACH ROW EXECUTE FUNCTION gusset_guard_library_review();
--> statement-breakpoint
-- A published or discarded draft is finished: its row no longer changes.
CREATE OR REPLACE FUNCTION gusset_guard_library_draft() RETURNS trigger
LANGUAGE plpgsql AS $$
BEGIN
  IF TG_OP = 'DELETE' THEN
    RAISE EXCEPTION 'library_drafts: a draft is discarded, never deleted' USING ERRCODE = 'insufficient_privilege';
  END IF;
  IF OLD.state IN ('published', 'discarded') THEN
    RAISE EXCEPTION 'library_drafts: this draft is % and no longer changes', OLD.state USING ERRCODE = 'insufficient_privilege';
  END IF;
  RETURN NEW;
END;
$$;
--> statement-breakpoint
CREATE TRIGGER library_drafts_guard BEFORE UPDATE OR DELETE ON "library_drafts"
  FOR EACH ROW EXECUTE FUNCTION gusset_guard_library_draft();
