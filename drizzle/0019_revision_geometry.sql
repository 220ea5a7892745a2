-- The viewer's binary geometry of a revision (lib/models/geometry-wire.ts), packed once when the revision is saved:
-- opening the viewer read the whole model (3 MB of JSON on a 60 x 60 roof) and packed it on every request, in the
-- web process, while the page's scripts waited to be served (issue 13 navigation). lz4 like the analysis JSON (0018):
-- reading it back costs next to nothing. Revisions saved before this have none and are packed on request.
ALTER TABLE "model_revisions" ADD COLUMN "geometry" "bytea";--> statement-breakpoint
ALTER TABLE "model_revisions" ALTER COLUMN "geometry" SET COMPRESSION lz4;
