import { createProject, listProjectsForUser } from "@/db/queries/projects";
import { accountRoute } from "@/lib/http/route";
import { createProjectSchema } from "@/lib/projects/schemas";

/** The signed-in user's projects, with their role and abilities on each. */
export const GET = accountRoute({}, async ({ user }) => Response.json({ projects: await listProjectsForUser({ userId: user.id }) }));

/** Any signed-in user creates a project and becomes its owner (organisation: see createProject). */
export const POST = accountRoute({ body: createProjectSchema }, async ({ user, body }) =>
  Response.json({ project: await createProject({ userId: user.id, input: body }) }, { status: 201 }),
);
