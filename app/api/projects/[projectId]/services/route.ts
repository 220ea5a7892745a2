import { createDerivedRevision, getLatestAnalysisForRevision, listRunsByRevision } from "@/db/queries/mep";
import { getProjectById } from "@/db/queries/projects";
import { NotFoundError, ValidationError } from "@/lib/http/errors";
import { projectParamsSchema } from "@/lib/http/params";
import { projectRoute } from "@/lib/http/route";
import { requireRevision } from "@/lib/mep/revision";
import { hangServicesSchema } from "@/lib/mep/schemas";
import { hangServices, zeroForceChange } from "@/lib/mep/services";
import { analyseForStorage } from "@/lib/models/analyse";
import { STANDING_CAUTION } from "@/lib/review/caution";

/**
 * "Hang the services": the revision's runs become the hung-services load case of a new revision, which is analysed
 * and reviewed now and gets the runs and its clashes; the answer says which members stop (or start) being zero
 * in every combination.
 */
export const POST = projectRoute(
  // A new revision with a new analysis: the same two permissions as saving a model.
  { params: projectParamsSchema, body: hangServicesSchema, action: ["model.edit", "analysis.run"] },
  async ({ params: { projectId }, body: input, user }) => {
    const revision = await requireRevision(projectId, input.revision);
    const runs = await listRunsByRevision({ revisionId: revision.id });
    if (runs.length === 0) throw new ValidationError([{ path: "revision", message: "This revision has no runs to hang." }], "This revision has no runs to hang.");
    const [project, before] = await Promise.all([getProjectById({ projectId }), getLatestAnalysisForRevision({ revisionId: revision.id })]);
    if (!project) throw new NotFoundError();
    const hung = hangServices(revision.model, runs, input.hangerSpacing);
    const { result, review } = analyseForStorage(hung.model, project.designStandard);
    const created = await createDerivedRevision({
      projectId,
      fromRevisionId: revision.id,
      revision: { name: `${revision.model.name} + hung services (from r${revision.number})`, model: hung.model, source: "generated", result, review },
      actorId: user.id,
    });
    return Response.json(
      {
        revision: { number: created.number, status: result.status },
        totalLoad: hung.totalLoad,
        hangers: hung.hangers.length,
        zeroForce: before && before.result.status === "ok" && result.status === "ok" ? zeroForceChange(before.result, result) : null,
        detection: created.detection,
        caution: STANDING_CAUTION,
      },
      { status: 201 },
    );
  },
);
