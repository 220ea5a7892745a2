CREATE TYPE "public"."clash_entry_kind" AS ENUM('proposal', 'decision', 'supersession', 'recheck', 'closure');--> statement-breakpoint
ALTER TYPE "public"."mail_kind" ADD VALUE 'proposal' BEFORE 'decision';--> statement-breakpoint
ALTER TYPE "public"."mail_kind" ADD VALUE 'recheck' BEFORE 'digest';--> statement-breakpoint
ALTER TYPE "public"."clash_outcome" ADD VALUE 'opening_refused' BEFORE 'member_change_needed';--> statement-breakpoint
ALTER TYPE "public"."clash_status" ADD VALUE 'closed';--> statement-breakpoint
ALTER TABLE "clash_decisions" ALTER COLUMN "outcome" DROP NOT NULL;--> statement-breakpoint
ALTER TABLE "model_revisions" ADD COLUMN "is_current" boolean DEFAULT false NOT NULL;--> statement-breakpoint
ALTER TABLE "clash_decisions" ADD COLUMN "kind" "clash_entry_kind" DEFAULT 'proposal' NOT NULL;--> statement-breakpoint
ALTER TABLE "clash_decisions" ADD COLUMN "reason" text;--> statement-breakpoint
ALTER TABLE "clash_decisions" ADD COLUMN "role" "project_role";--> statement-breakpoint
ALTER TABLE "clash_decisions" ADD COLUMN "revision_id" uuid;--> statement-breakpoint
ALTER TABLE "clash_decisions" ADD COLUMN "analysis_run_id" uuid;--> statement-breakpoint
ALTER TABLE "clash_decisions" ADD COLUMN "supersedes_id" uuid;--> statement-breakpoint
ALTER TABLE "clashes" ADD COLUMN "recheck_reason" text;--> statement-breakpoint
ALTER TABLE "clashes" ADD COLUMN "closed_reason" text;--> statement-breakpoint
ALTER TABLE "clashes" ADD COLUMN "assignee_id" uuid;--> statement-breakpoint
ALTER TABLE "clashes" ADD COLUMN "due_on" date;--> statement-breakpoint
ALTER TABLE "clash_decisions" ADD CONSTRAINT "clash_decisions_revision_id_model_revisions_id_fk" FOREIGN KEY ("revision_id") REFERENCES "public"."model_revisions"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "clash_decisions" ADD CONSTRAINT "clash_decisions_analysis_run_id_analysis_runs_id_fk" FOREIGN KEY ("analysis_run_id") REFERENCES "public"."analysis_runs"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "clashes" ADD CONSTRAINT "clashes_assignee_id_users_id_fk" FOREIGN KEY ("assignee_id") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
CREATE UNIQUE INDEX "model_revisions_current_idx" ON "model_revisions" USING btree ("project_id") WHERE is_current;--> statement-breakpoint
UPDATE "clash_decisions" SET "kind" = 'decision' WHERE "outcome" = 'opening_accepted';--> statement-breakpoint
-- The history of a clash is append-only: what was proposed or decided, by whom and why never changes. Only the
-- references that ON DELETE SET NULL clears (a deleted account, revision or result set) may change.
CREATE FUNCTION "clash_decisions_append_only"() RETURNS trigger LANGUAGE plpgsql AS $$
BEGIN
  IF (NEW.id, NEW.clash_id, NEW.kind, NEW.outcome, NEW.note, NEW.conditions, NEW.reason, NEW.caution, NEW.role, NEW.supersedes_id, NEW.created_at)
     IS DISTINCT FROM (OLD.id, OLD.clash_id, OLD.kind, OLD.outcome, OLD.note, OLD.conditions, OLD.reason, OLD.caution, OLD.role, OLD.supersedes_id, OLD.created_at) THEN
    RAISE EXCEPTION 'clash history is append-only' USING ERRCODE = 'check_violation';
  END IF;
  RETURN NEW;
END $$;--> statement-breakpoint
CREATE TRIGGER "clash_decisions_append_only" BEFORE UPDATE ON "clash_decisions" FOR EACH ROW EXECUTE FUNCTION "clash_decisions_append_only"();
