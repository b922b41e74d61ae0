-- Published standards never change. A version, its status events and the reviewers' comments are
-- append-only: the database refuses UPDATE, DELETE and TRUNCATE on them, whoever asks (the app's role is
-- also granted only SELECT and INSERT there, by scripts/lib/app-privileges.ts, which reads these triggers).
CREATE OR REPLACE FUNCTION gusset_refuse_change() RETURNS trigger
LANGUAGE plpgsql AS $$
BEGIN
  RAISE EXCEPTION '% is append-only: % is not allowed', TG_TABLE_NAME, TG_OP
    USING ERRCODE = 'insufficient_privilege';
END;
$$;
--> statement-breakpoint
CREATE TRIGGER standard_versions_no_update_delete BEFORE UPDATE OR DELETE ON "standard_versions"
  FOR EACH ROW EXECUTE FUNCTION gusset_refuse_change();
--> statement-breakpoint
CREATE TRIGGER standard_versions_no_truncate BEFORE TRUNCATE ON "standard_versions"
  FOR EACH STATEMENT EXECUTE FUNCTION gusset_refuse_change();
--> statement-breakpoint
CREATE TRIGGER standard_version_events_no_update_delete BEFORE UPDATE OR DELETE ON "standard_version_events"
  FOR EACH ROW EXECUTE FUNCTION gusset_refuse_change();
--> statement-breakpoint
CREATE TRIGGER standard_version_events_no_truncate BEFORE TRUNCATE ON "standard_version_events"
  FOR EACH STATEMENT EXECUTE FUNCTION gusset_refuse_change();
--> statement-breakpoint
CREATE TRIGGER standard_review_comments_no_update_delete BEFORE UPDATE OR DELETE ON "standard_review_comments"
  FOR EACH ROW EXECUTE FUNCTION gusset_refuse_change();
--> statement-breakpoint
CREATE TRIGGER standard_review_comments_no_truncate BEFORE TRUNCATE ON "standard_review_comments"
  FOR EACH STATEMENT EXECUTE FUNCTION gusset_refuse_change();
--> statement-breakpoint
-- A submission is decided once; what was submitted (source, changelog, who, when) never changes.
CREATE OR REPLACE FUNCTION gusset_guard_review() RETURNS trigger
LANGUAGE plpgsql AS $$
BEGIN
  IF TG_OP = 'DELETE' THEN
    RAISE EXCEPTION 'standard_reviews: a submission is never deleted' USING ERRCODE = 'insufficient_privilege';
  END IF;
  IF OLD.outcome IS NOT NULL THEN
    RAISE EXCEPTION 'standard_reviews: this submission was already decided (%)', OLD.outcome
      USING ERRCODE = 'insufficient_privilege';
  END IF;
  IF NEW.source IS DISTINCT FROM OLD.source OR NEW.changelog IS DISTINCT FROM OLD.changelog
     OR NEW.submitted_by_id IS DISTINCT FROM OLD.submitted_by_id OR NEW.submitted_at IS DISTINCT FROM OLD.submitted_at
     OR NEW.draft_id IS DISTINCT FROM OLD.draft_id OR NEW.round IS DISTINCT FROM OLD.round THEN
    RAISE EXCEPTION 'standard_reviews: what was submitted does not change' USING ERRCODE = 'insufficient_privilege';
  END IF;
  RETURN NEW;
END;
$$;
--> statement-breakpoint
CREATE TRIGGER standard_reviews_guard BEFORE UPDATE OR DELETE ON "standard_reviews"
  FOR EACH ROW EXECUTE FUNCTION gusset_guard_review();
--> statement-breakpoint
-- A published or discarded draft is finished: its row no longer changes.
CREATE OR REPLACE FUNCTION gusset_guard_draft() RETURNS trigger
LANGUAGE plpgsql AS $$
BEGIN
  IF TG_OP = 'DELETE' THEN
    RAISE EXCEPTION 'standard_drafts: a draft is discarded, never deleted' USING ERRCODE = 'insufficient_privilege';
  END IF;
  IF OLD.state IN ('published', 'discarded') THEN
    RAISE EXCEPTION 'standard_drafts: this draft is % and no longer changes', OLD.state USING ERRCODE = 'insufficient_privilege';
  END IF;
  RETURN NEW;
END;
$$;
--> statement-breakpoint
CREATE TRIGGER standard_drafts_guard BEFORE UPDATE OR DELETE ON "standard_drafts"
  FOR EACH ROW EXECUTE FUNCTION gusset_guard_draft();
