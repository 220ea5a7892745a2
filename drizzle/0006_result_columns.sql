CREATE TABLE "result_columns" (
	"analysis_run_id" uuid NOT NULL,
	"result_id" text NOT NULL,
	"forces" "bytea" NOT NULL,
	"zero" "bytea" NOT NULL,
	"displacements" "bytea" NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "result_columns_analysis_run_id_result_id_pk" PRIMARY KEY("analysis_run_id","result_id")
);
--> statement-breakpoint
ALTER TABLE "analysis_runs" ADD COLUMN "utilisation" "bytea";--> statement-breakpoint
ALTER TABLE "analysis_runs" ADD COLUMN "verdicts" "bytea";--> statement-breakpoint
ALTER TABLE "analysis_runs" ADD COLUMN "zero_in_all" "bytea";--> statement-breakpoint
ALTER TABLE "model_revisions" ADD COLUMN "member_order" text[] DEFAULT '{}'::text[] NOT NULL;--> statement-breakpoint
ALTER TABLE "result_columns" ADD CONSTRAINT "result_columns_analysis_run_id_analysis_runs_id_fk" FOREIGN KEY ("analysis_run_id") REFERENCES "public"."analysis_runs"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
UPDATE "model_revisions" SET "member_order" = ARRAY(SELECT m->>'id' FROM jsonb_array_elements("model"->'members') WITH ORDINALITY AS e(m, k) ORDER BY k);
