import { listProjectsForUser } from "@/db/queries/projects";
import { requireUser } from "@/lib/auth/guard";
import { getRequestUser } from "@/lib/auth/session";
import { handleRoute } from "@/lib/http/errors";

/** The signed-in user's projects, with their role and abilities on each. */
export const GET = handleRoute(async (request: Request) => {
  const user = requireUser(await getRequestUser(request));
  return Response.json({ projects: await listProjectsForUser({ userId: user.id }) });
});
