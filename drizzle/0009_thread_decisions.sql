ALTER TYPE "public"."comment_kind" ADD VALUE 'proposal' BEFORE 'decision';--> statement-breakpoint
ALTER TYPE "public"."comment_kind" ADD VALUE 'supersession';--> statement-breakpoint
ALTER TABLE "comments" ADD COLUMN "role" "project_role";--> statement-breakpoint
ALTER TABLE "comments" ADD COLUMN "conditions" text;--> statement-breakpoint
ALTER TABLE "comments" ADD COLUMN "revision_id" uuid;--> statement-breakpoint
ALTER TABLE "comments" ADD COLUMN "analysis_run_id" uuid;--> statement-breakpoint
ALTER TABLE "comments" ADD COLUMN "caution" text;--> statement-breakpoint
ALTER TABLE "comments" ADD COLUMN "supersedes_id" uuid;--> statement-breakpoint
ALTER TABLE "comments" ADD CONSTRAINT "comments_revision_id_model_revisions_id_fk" FOREIGN KEY ("revision_id") REFERENCES "public"."model_revisions"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "comments" ADD CONSTRAINT "comments_analysis_run_id_analysis_runs_id_fk" FOREIGN KEY ("analysis_run_id") REFERENCES "public"."analysis_runs"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
-- The record of a thread (proposals, decisions, supersessions) is append-only, like a clash's history: what was
-- said, by whom in which role, on which revision, with which conditions and caution never changes, no comment
-- becomes a step nor a step a comment, and a step is never deleted while its pin stands (deleting the pin, or its
-- project, takes its thread with it: the pin row is gone when the cascade reaches its comments). Only the
-- references ON DELETE SET NULL clears (a deleted revision or result set) may change.
CREATE FUNCTION "comment_steps_append_only"() RETURNS trigger LANGUAGE plpgsql AS $$
BEGIN
  IF TG_OP = 'DELETE' THEN
    IF OLD.kind <> 'comment' AND EXISTS (SELECT 1 FROM "pins" WHERE "id" = OLD.pin_id) THEN
      RAISE EXCEPTION 'the record of a thread is append-only: a % cannot be deleted', OLD.kind USING ERRCODE = 'check_violation';
    END IF;
    RETURN OLD;
  END IF;
  IF (OLD.kind <> 'comment' OR NEW.kind <> 'comment')
     AND (NEW.id, NEW.pin_id, NEW.author_id, NEW.kind, NEW.body, NEW.mentions, NEW.role, NEW.conditions, NEW.caution, NEW.supersedes_id, NEW.created_at)
     IS DISTINCT FROM (OLD.id, OLD.pin_id, OLD.author_id, OLD.kind, OLD.body, OLD.mentions, OLD.role, OLD.conditions, OLD.caution, OLD.supersedes_id, OLD.created_at) THEN
    RAISE EXCEPTION 'the record of a thread is append-only: a % cannot be changed', OLD.kind USING ERRCODE = 'check_violation';
  END IF;
  RETURN NEW;
END $$;--> statement-breakpoint
CREATE TRIGGER "comment_steps_append_only" BEFORE UPDATE OR DELETE ON "comments" FOR EACH ROW EXECUTE FUNCTION "comment_steps_append_only"();
