import { createProject, listProjectsForUser } from "@/db/queries/projects";
import { requireUser } from "@/lib/auth/guard";
import { getRequestUser } from "@/lib/auth/session";
import { handleRoute } from "@/lib/http/errors";
import { parseJson } from "@/lib/http/parse";
import { createProjectSchema } from "@/lib/projects/schemas";

/** The signed-in user's projects, with their role and abilities on each. */
export const GET = handleRoute(async (request: Request) => {
  const user = requireUser(await getRequestUser(request));
  return Response.json({ projects: await listProjectsForUser({ userId: user.id }) });
});

/** Any signed-in user creates a project and becomes its owner (organisation: see createProject). */
export const POST = handleRoute(async (request: Request) => {
  const user = requireUser(await getRequestUser(request));
  const input = await parseJson(request, createProjectSchema);
  return Response.json({ project: await createProject({ userId: user.id, input }) }, { status: 201 });
});
