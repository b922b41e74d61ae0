DROP INDEX "runs_version_idx";--> statement-breakpoint
DROP INDEX "runs_person_idx";--> statement-breakpoint
CREATE INDEX "runs_version_created_idx" ON "runs" USING btree ("version_id","created_at" DESC NULLS LAST,"id" DESC NULLS LAST);--> statement-breakpoint
CREATE INDEX "runs_person_created_idx" ON "runs" USING btree ("created_by_id","created_at" DESC NULLS LAST,"id" DESC NULLS LAST);--> statement-breakpoint
CREATE INDEX "runs_utilisation_idx" ON "runs" USING btree (coalesce("max_utilisation", '-Infinity'::float8) desc nulls last,"created_at" DESC NULLS LAST,"id" DESC NULLS LAST);--> statement-breakpoint
CREATE INDEX "runs_failed_created_idx" ON "runs" USING btree ("created_at" DESC NULLS LAST,"id" DESC NULLS LAST) WHERE "runs"."outcome" = 'failed';--> statement-breakpoint
CREATE INDEX "runs_not_passing_created_idx" ON "runs" USING btree ("created_at" DESC NULLS LAST,"id" DESC NULLS LAST) WHERE "runs"."pass" = false;