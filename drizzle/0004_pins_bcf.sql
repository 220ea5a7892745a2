ALTER TABLE "comments" ADD COLUMN "bcf_guid" text;--> statement-breakpoint
ALTER TABLE "comments" ADD COLUMN "external_author" text;--> statement-breakpoint
ALTER TABLE "pins" ADD COLUMN "viewpoint" jsonb;--> statement-breakpoint
ALTER TABLE "pins" ADD COLUMN "bcf_guid" text;--> statement-breakpoint
ALTER TABLE "pins" ADD COLUMN "labels" text[] DEFAULT '{}'::text[] NOT NULL;--> statement-breakpoint
ALTER TABLE "pins" ADD COLUMN "assigned_to" text;--> statement-breakpoint
ALTER TABLE "pins" ADD COLUMN "due_at" timestamp with time zone;--> statement-breakpoint
CREATE UNIQUE INDEX "comments_bcf_guid_idx" ON "comments" USING btree ("pin_id","bcf_guid");--> statement-breakpoint
CREATE UNIQUE INDEX "pins_bcf_guid_idx" ON "pins" USING btree ("project_id","bcf_guid");