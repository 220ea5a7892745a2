import { getProjectById } from "@/db/queries/projects";
import { NotFoundError } from "@/lib/http/errors";
import { projectParamsSchema } from "@/lib/http/params";
import { projectRoute } from "@/lib/http/route";
import { projectForMember } from "@/lib/projects/for-member";

/** One project, with the caller's role and abilities. */
export const GET = projectRoute({ params: projectParamsSchema, action: "project.read" }, async ({ params, membership }) => {
  const project = await getProjectById({ projectId: params.projectId });
  if (!project) throw new NotFoundError();
  return Response.json({ project: projectForMember(project, membership.role) });
});
