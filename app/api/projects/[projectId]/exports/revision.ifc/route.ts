import { listClashesByRevision } from "@/db/queries/clashes";
import { listRunsByRevision } from "@/db/queries/mep";
import { getProjectById } from "@/db/queries/projects";
import { NotFoundError } from "@/lib/http/errors";
import { projectParamsSchema } from "@/lib/http/params";
import { projectRoute } from "@/lib/http/route";
import { exportIfc, type ExportOpening } from "@/lib/ifc";
import { ifcExportQuerySchema } from "@/lib/ifc/schemas";
import { loadAnalysedRevision, requireResults } from "@/app/api/projects/[projectId]/_lib/report-data";

/**
 * A revision as IFC4: members as IfcMember tubes, the force state of `?result=` as a property set, and the openings
 * the structural engineer accepted (sized by the run's outer size, insulation and clearance).
 */
export const GET = projectRoute({ params: projectParamsSchema, query: ifcExportQuerySchema, action: "report.export" }, async ({ params: { projectId }, query }) => {
  const project = await getProjectById({ projectId });
  if (!project) throw new NotFoundError();
  const revision = await loadAnalysedRevision({ projectId, revision: query.revision });
  if (query.result) requireResults(revision.analysis.result, [query.result], "result");
  const chosen = query.result ? revision.analysis.result.results[query.result] : undefined;
  const clashes = await listClashesByRevision({ revisionId: revision.id });
  const runs = new Map((await listRunsByRevision({ revisionId: revision.id })).map((r) => [r.id, r]));
  const openings: ExportOpening[] = clashes
    .filter((c) => c.outcome === "opening_accepted")
    .flatMap((c) => {
      const run = runs.get(c.runId);
      const a = run?.points[c.segmentIndex];
      const b = run?.points[c.segmentIndex + 1];
      if (!run || !a || !b) return [];
      const size = run.profile.shape === "round" ? run.profile.diameter : Math.hypot(run.profile.width, run.profile.height);
      return [{ clashKey: c.clashKey, memberId: c.memberId, runId: c.runId, point: [c.point.x, c.point.y, c.point.z], direction: [b.x - a.x, b.y - a.y, b.z - a.z], diameter: size + 2 * (run.insulation + run.clearance), conditions: c.conditions ?? "" }];
    });
  const fileName = `${project.name.replace(/[^A-Za-z0-9_.-]+/g, "-")}-rev${revision.number}.ifc`;
  const text = exportIfc({
    model: revision.model,
    projectName: project.name,
    fileName,
    time: new Date().toISOString().slice(0, 19),
    result: chosen && query.result ? { id: query.result, name: query.result, memberForces: chosen.memberForces, zeroForceMembers: chosen.zeroForceMembers } : undefined,
    openings,
  });
  return new Response(text, { headers: { "content-type": "application/x-step", "content-disposition": `attachment; filename="${fileName}"` } });
});
