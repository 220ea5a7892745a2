import { getProjectForMember } from "@/db/queries/projects";
import { NotFoundError } from "@/lib/http/errors";
import { projectParamsSchema } from "@/lib/http/params";
import { projectRoute } from "@/lib/http/route";

/** One project, with the caller's role and abilities. */
export const GET = projectRoute({ params: projectParamsSchema, action: "project.read" }, async ({ params, membership }) => {
  const project = await getProjectForMember({ projectId: params.projectId, role: membership.role });
  if (!project) throw new NotFoundError();
  return Response.json({ project });
});
