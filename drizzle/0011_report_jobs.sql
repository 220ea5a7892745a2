ALTER TYPE "public"."file_purpose" ADD VALUE 'report';--> statement-breakpoint
ALTER TYPE "public"."job_kind" ADD VALUE 'report';