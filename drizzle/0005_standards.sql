CREATE TABLE "standard_drafts" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"standard_id" uuid NOT NULL,
	"based_on_version_id" uuid,
	"author_id" text NOT NULL,
	"source" text NOT NULL,
	"state" text DEFAULT 'editing' NOT NULL,
	"published_version_id" uuid,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "standard_drafts_state_check" CHECK ("standard_drafts"."state" in ('editing', 'in-review', 'published', 'discarded'))
);
--> statement-breakpoint
CREATE TABLE "standard_review_comments" (
	"id" bigserial PRIMARY KEY NOT NULL,
	"review_id" uuid NOT NULL,
	"line" integer,
	"body" text NOT NULL,
	"author_id" text NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "standard_reviews" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"draft_id" uuid NOT NULL,
	"round" integer NOT NULL,
	"source" text NOT NULL,
	"changelog" text NOT NULL,
	"submitted_by_id" text NOT NULL,
	"submitted_at" timestamp with time zone DEFAULT now() NOT NULL,
	"reviewer_id" text,
	"outcome" text,
	"note" text,
	"decided_at" timestamp with time zone,
	CONSTRAINT "standard_reviews_round_unique" UNIQUE("draft_id","round"),
	CONSTRAINT "standard_reviews_outcome_check" CHECK ("standard_reviews"."outcome" is null or "standard_reviews"."outcome" in ('returned', 'approved')),
	CONSTRAINT "standard_reviews_four_eyes" CHECK ("standard_reviews"."reviewer_id" is null or "standard_reviews"."reviewer_id" <> "standard_reviews"."submitted_by_id")
);
--> statement-breakpoint
CREATE TABLE "standard_version_events" (
	"id" bigserial PRIMARY KEY NOT NULL,
	"version_id" uuid NOT NULL,
	"kind" text NOT NULL,
	"reason" text,
	"actor_id" text,
	"occurred_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "standard_version_events_kind_check" CHECK ("standard_version_events"."kind" in ('published', 'superseded', 'withdrawn'))
);
--> statement-breakpoint
CREATE TABLE "standard_versions" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"standard_id" uuid NOT NULL,
	"number" integer NOT NULL,
	"source" text NOT NULL,
	"content_hash" text NOT NULL,
	"title" text NOT NULL,
	"category" text NOT NULL,
	"tags" text[] DEFAULT '{}'::text[] NOT NULL,
	"summary" text NOT NULL,
	"changelog" text NOT NULL,
	"author_id" text NOT NULL,
	"reviewer_id" text NOT NULL,
	"based_on_version_id" uuid,
	"draft_id" uuid,
	"review_id" uuid,
	"verified_with" text NOT NULL,
	"verification" jsonb NOT NULL,
	"published_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "standard_versions_number_unique" UNIQUE("standard_id","number"),
	CONSTRAINT "standard_versions_number_check" CHECK ("standard_versions"."number" >= 1),
	CONSTRAINT "standard_versions_four_eyes" CHECK ("standard_versions"."reviewer_id" <> "standard_versions"."author_id"),
	CONSTRAINT "standard_versions_hash_check" CHECK ("standard_versions"."content_hash" ~ '^[0-9a-f]{64}$')
);
--> statement-breakpoint
CREATE TABLE "standards" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"slug" text NOT NULL,
	"created_by_id" text,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "standards_slug_unique" UNIQUE("slug")
);
--> statement-breakpoint
ALTER TABLE "standard_drafts" ADD CONSTRAINT "standard_drafts_standard_id_standards_id_fk" FOREIGN KEY ("standard_id") REFERENCES "public"."standards"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "standard_drafts" ADD CONSTRAINT "standard_drafts_based_on_version_id_standard_versions_id_fk" FOREIGN KEY ("based_on_version_id") REFERENCES "public"."standard_versions"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "standard_drafts" ADD CONSTRAINT "standard_drafts_author_id_user_id_fk" FOREIGN KEY ("author_id") REFERENCES "public"."user"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "standard_drafts" ADD CONSTRAINT "standard_drafts_published_version_id_standard_versions_id_fk" FOREIGN KEY ("published_version_id") REFERENCES "public"."standard_versions"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "standard_review_comments" ADD CONSTRAINT "standard_review_comments_review_id_standard_reviews_id_fk" FOREIGN KEY ("review_id") REFERENCES "public"."standard_reviews"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "standard_review_comments" ADD CONSTRAINT "standard_review_comments_author_id_user_id_fk" FOREIGN KEY ("author_id") REFERENCES "public"."user"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "standard_reviews" ADD CONSTRAINT "standard_reviews_draft_id_standard_drafts_id_fk" FOREIGN KEY ("draft_id") REFERENCES "public"."standard_drafts"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "standard_reviews" ADD CONSTRAINT "standard_reviews_submitted_by_id_user_id_fk" FOREIGN KEY ("submitted_by_id") REFERENCES "public"."user"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "standard_reviews" ADD CONSTRAINT "standard_reviews_reviewer_id_user_id_fk" FOREIGN KEY ("reviewer_id") REFERENCES "public"."user"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "standard_version_events" ADD CONSTRAINT "standard_version_events_version_id_standard_versions_id_fk" FOREIGN KEY ("version_id") REFERENCES "public"."standard_versions"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "standard_version_events" ADD CONSTRAINT "standard_version_events_actor_id_user_id_fk" FOREIGN KEY ("actor_id") REFERENCES "public"."user"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "standard_versions" ADD CONSTRAINT "standard_versions_standard_id_standards_id_fk" FOREIGN KEY ("standard_id") REFERENCES "public"."standards"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "standard_versions" ADD CONSTRAINT "standard_versions_author_id_user_id_fk" FOREIGN KEY ("author_id") REFERENCES "public"."user"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "standard_versions" ADD CONSTRAINT "standard_versions_reviewer_id_user_id_fk" FOREIGN KEY ("reviewer_id") REFERENCES "public"."user"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "standard_versions" ADD CONSTRAINT "standard_versions_based_on_version_id_standard_versions_id_fk" FOREIGN KEY ("based_on_version_id") REFERENCES "public"."standard_versions"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "standard_versions" ADD CONSTRAINT "standard_versions_draft_id_standard_drafts_id_fk" FOREIGN KEY ("draft_id") REFERENCES "public"."standard_drafts"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "standard_versions" ADD CONSTRAINT "standard_versions_review_id_standard_reviews_id_fk" FOREIGN KEY ("review_id") REFERENCES "public"."standard_reviews"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "standards" ADD CONSTRAINT "standards_created_by_id_user_id_fk" FOREIGN KEY ("created_by_id") REFERENCES "public"."user"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "standard_drafts_standard_idx" ON "standard_drafts" USING btree ("standard_id");--> statement-breakpoint
CREATE INDEX "standard_review_comments_review_idx" ON "standard_review_comments" USING btree ("review_id");--> statement-breakpoint
CREATE INDEX "standard_version_events_version_idx" ON "standard_version_events" USING btree ("version_id","id");