import { listProjectsForUser } from "@/db/queries/projects";
import { createProject } from "@/lib/commands/create-project";
import { accountRoute } from "@/lib/http/route";
import { projectForMember } from "@/lib/projects/for-member";
import { createProjectSchema } from "@/lib/projects/schemas";

/** The signed-in user's projects, with their role and abilities on each. */
export const GET = accountRoute({}, async ({ user }) => Response.json({ projects: (await listProjectsForUser({ userId: user.id })).map((p) => projectForMember(p, p.role)) }));

/** Any signed-in user creates a project and becomes its owner (organisation: see createProject). */
export const POST = accountRoute({ body: createProjectSchema }, async ({ user, body }) =>
  Response.json({ project: await createProject({ userId: user.id, input: body }) }, { status: 201 }),
);
