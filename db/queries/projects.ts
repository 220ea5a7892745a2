import "server-only";
import { asc, eq } from "drizzle-orm";
import { getDb, type Executor } from "@/db/client";
import { memberships, organizations, projects, type Project } from "@/db/schema";
import { abilitiesOf, type Action, type Role } from "@/lib/permissions";

export type PresentedProject = {
  id: string;
  name: string;
  description: string;
  organization: { id: string; name: string };
  designStandard: Project["designStandard"];
  combinationStandard: Project["combinationStandard"];
  createdAt: string;
};

/** A project as the browser sees it, with the caller's role and what that role may do. */
export type ProjectForMember = PresentedProject & { role: Role; abilities: Record<Action, boolean> };

function present(project: Project, organization: { id: string; name: string }): PresentedProject {
  return {
    id: project.id,
    name: project.name,
    description: project.description,
    organization,
    designStandard: project.designStandard,
    combinationStandard: project.combinationStandard,
    createdAt: project.createdAt.toISOString(),
  };
}

/** The project with its organisation, or null. */
export async function getProjectById({ projectId, db = getDb() }: { projectId: string; db?: Executor }): Promise<PresentedProject | null> {
  const [row] = await db
    .select({ project: projects, organization: { id: organizations.id, name: organizations.name } })
    .from(projects)
    .innerJoin(organizations, eq(organizations.id, projects.organizationId))
    .where(eq(projects.id, projectId))
    .limit(1);
  return row ? present(row.project, row.organization) : null;
}

/** The project as seen by one member (role and abilities added). */
export async function getProjectForMember({ projectId, role }: { projectId: string; role: Role }): Promise<ProjectForMember | null> {
  const project = await getProjectById({ projectId });
  return project ? { ...project, role, abilities: abilitiesOf(role) } : null;
}

/** Every project the user is a member of, by name, with their role on each. */
export async function listProjectsForUser({ userId, db = getDb() }: { userId: string; db?: Executor }): Promise<ProjectForMember[]> {
  const rows = await db
    .select({ project: projects, organization: { id: organizations.id, name: organizations.name }, role: memberships.role })
    .from(memberships)
    .innerJoin(projects, eq(projects.id, memberships.projectId))
    .innerJoin(organizations, eq(organizations.id, projects.organizationId))
    .where(eq(memberships.userId, userId))
    .orderBy(asc(projects.name));
  return rows.map((row) => ({ ...present(row.project, row.organization), role: row.role, abilities: abilitiesOf(row.role) }));
}
