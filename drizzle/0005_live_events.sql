CREATE TYPE "public"."live_event_kind" AS ENUM('clash', 'revision', 'runs', 'member');--> statement-breakpoint
CREATE TABLE "live_events" (
	"id" bigserial PRIMARY KEY NOT NULL,
	"project_id" uuid NOT NULL,
	"kind" "live_event_kind" NOT NULL,
	"subject_id" text NOT NULL,
	"revision" integer,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"published_at" timestamp with time zone
);
--> statement-breakpoint
ALTER TABLE "live_events" ADD CONSTRAINT "live_events_project_id_projects_id_fk" FOREIGN KEY ("project_id") REFERENCES "public"."projects"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "live_events_unpublished_idx" ON "live_events" USING btree ("id") WHERE published_at is null;