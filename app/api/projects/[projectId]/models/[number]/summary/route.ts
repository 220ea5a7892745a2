import { getRevisionOverview } from "@/db/queries/revision-view";
import { NotFoundError } from "@/lib/http/errors";
import { projectRoute } from "@/lib/http/route";
import { revisionParamsSchema } from "@/lib/models/schemas";
import { authorize } from "@/lib/permissions";

/**
 * What the viewer opens a revision with: its name, jobs, supports, load cases, combinations, analysis status,
 * result ids and the review without per-member rows, plus what the caller may start on it (the rule book's
 * answer). Small, and never cached: the jobs on it change. The geometry and the results are their own binary,
 * immutable answers; the whole revision (…/models/N) is fetched only when a browser what-if needs it.
 */
export const GET = projectRoute({ params: revisionParamsSchema, action: "project.read" }, async ({ params, membership }) => {
  const revision = await getRevisionOverview(params);
  if (!revision) throw new NotFoundError("No such revision.");
  return Response.json({ revision, abilities: { runAnalysis: authorize(membership, "analysis.run") } }, { headers: { "Cache-Control": "no-store" } });
});
