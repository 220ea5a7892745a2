import { getRevisionRef } from "@/db/queries/mep";
import { enqueueHangServices } from "@/lib/commands/enqueue-hang-services";
import { NotFoundError } from "@/lib/http/errors";
import { projectParamsSchema } from "@/lib/http/params";
import { projectRoute } from "@/lib/http/route";
import { hangServicesSchema } from "@/lib/mep/schemas";
import { STANDING_CAUTION } from "@/lib/review/caution";

/**
 * "Hang the services": queues a job (server/jobs/hang-services.ts) that makes the revision's runs the hung-services
 * load case of a new revision, with the runs and their clashes, and queues that revision's analysis; its outcome
 * says which members stop (or start) being zero in every combination. Answers 202 with the job to follow.
 */
export const POST = projectRoute(
  // A new revision with a new analysis: the same two permissions as saving a model.
  { params: projectParamsSchema, body: hangServicesSchema, action: ["model.edit", "analysis.run"] },
  async ({ params: { projectId }, body: input, user }) => {
    const revision = await getRevisionRef({ projectId, number: input.revision });
    if (!revision) throw new NotFoundError("No such model revision on this project.");
    const job = await enqueueHangServices({ projectId, revision, hangerSpacing: input.hangerSpacing, actorId: user.id });
    return Response.json({ job, caution: STANDING_CAUTION }, { status: 202 });
  },
);
