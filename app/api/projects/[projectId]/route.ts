import { getProjectById } from "@/db/queries/projects";
import { changeProjectSettings } from "@/lib/commands/change-project-settings";
import { NotFoundError } from "@/lib/http/errors";
import { projectParamsSchema } from "@/lib/http/params";
import { projectRoute } from "@/lib/http/route";
import { projectForMember } from "@/lib/projects/for-member";
import { projectSettingsSchema } from "@/lib/projects/schemas";

/** One project, with the caller's role and abilities. */
export const GET = projectRoute({ params: projectParamsSchema, action: "project.read" }, async ({ params, membership }) => {
  const project = await getProjectById({ projectId: params.projectId });
  if (!project) throw new NotFoundError();
  return Response.json({ project: projectForMember(project, membership.role) });
});

/** Changes the project's settings (owner or structural engineer); applies from the next analysis. */
export const PATCH = projectRoute({ params: projectParamsSchema, body: projectSettingsSchema, action: "project.settings" }, async ({ params, body, user }) => {
  const settings = await changeProjectSettings({ projectId: params.projectId, settings: body, actorId: user.id });
  return Response.json({ settings });
});
