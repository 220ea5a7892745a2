import { listRunsByRevision } from "@/db/queries/mep";
import { hangServicesRevision } from "@/lib/commands/hang-services";
import { ValidationError } from "@/lib/http/errors";
import { projectParamsSchema } from "@/lib/http/params";
import { projectRoute } from "@/lib/http/route";
import { requireRevision } from "@/app/api/projects/[projectId]/_lib/require-revision";
import { hangServicesSchema } from "@/lib/mep/schemas";
import { hangServices } from "@/lib/mep/services";
import { STANDING_CAUTION } from "@/lib/review/caution";

/**
 * "Hang the services": the revision's runs become the hung-services load case of a new revision, which gets the
 * runs and its clashes now and is analysed by a job; the job's outcome says which members stop (or start) being
 * zero in every combination.
 */
export const POST = projectRoute(
  // A new revision with a new analysis: the same two permissions as saving a model.
  { params: projectParamsSchema, body: hangServicesSchema, action: ["model.edit", "analysis.run"] },
  async ({ params: { projectId }, body: input, user }) => {
    const revision = await requireRevision(projectId, input.revision);
    const runs = await listRunsByRevision({ revisionId: revision.id });
    if (runs.length === 0) throw new ValidationError([{ path: "revision", message: "This revision has no runs to hang." }], "This revision has no runs to hang.");
    const hung = hangServices(revision.model, runs, input.hangerSpacing);
    const created = await hangServicesRevision({
      projectId,
      userId: user.id,
      fromRevisionId: revision.id,
      name: `${revision.model.name} + hung services (from r${revision.number})`,
      model: hung.model,
    });
    return Response.json(
      { revision: created.revision, job: created.job, totalLoad: hung.totalLoad, hangers: hung.hangers.length, detection: created.detection, caution: STANDING_CAUTION },
      { status: 202 },
    );
  },
);
