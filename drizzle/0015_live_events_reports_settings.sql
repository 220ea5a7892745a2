ALTER TYPE "public"."live_event_kind" ADD VALUE 'report';--> statement-breakpoint
ALTER TYPE "public"."live_event_kind" ADD VALUE 'settings';