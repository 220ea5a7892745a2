-- The stored analysis JSON (analysis_runs.result and .review; 66 MB and 196 MB of text for a 120 x 120 roof) is
-- compressed with lz4 instead of PostgreSQL's default pglz. Reading one member's entry (the member panel,
-- `review -> 'members' -> id`) decompresses the whole value; measured on the 60 x 60 review (50 MB) on this machine:
-- that read 0.26 s -> 0.04 s, the insert 1.63 s -> 1.30 s, 8.7 MB -> 5.2 MB stored. Applies to values written from now on.
ALTER TABLE "analysis_runs" ALTER COLUMN "result" SET COMPRESSION lz4;--> statement-breakpoint
ALTER TABLE "analysis_runs" ALTER COLUMN "review" SET COMPRESSION lz4;
