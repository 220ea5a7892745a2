import "server-only";
import { and, asc, eq } from "drizzle-orm";
import { getDb, type Executor } from "@/db/client";
import { memberships, organizations, projects, type Membership, type Project } from "@/db/schema";
import type { PresentedProject } from "@/lib/projects/for-member";

export type { PresentedProject };

function present(project: Project, organization: { id: string; name: string }): PresentedProject {
  return {
    id: project.id,
    name: project.name,
    description: project.description,
    organization,
    designStandard: project.designStandard,
    combinationStandard: project.combinationStandard,
    deflectionLimit: project.deflectionLimit,
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

/** Every project the user is a member of, by name, with their role on each. */
export async function listProjectsForUser({ userId, db = getDb() }: { userId: string; db?: Executor }): Promise<(PresentedProject & { role: Membership["role"] })[]> {
  const rows = await db
    .select({ project: projects, organization: { id: organizations.id, name: organizations.name }, role: memberships.role })
    .from(memberships)
    .innerJoin(projects, eq(projects.id, memberships.projectId))
    .innerJoin(organizations, eq(organizations.id, projects.organizationId))
    .where(eq(memberships.userId, userId))
    .orderBy(asc(projects.name));
  return rows.map((row) => ({ ...present(row.project, row.organization), role: row.role }));
}

/**
 * The user's organisation: users carry no organisation of their own, so it is the organisation of the first
 * project they own (owners are the ones who create projects). Null when they own none.
 */
export async function getOwnedOrganization({ userId, db = getDb() }: { userId: string; db?: Executor }): Promise<{ id: string; name: string } | null> {
  const [row] = await db
    .select({ id: organizations.id, name: organizations.name })
    .from(memberships)
    .innerJoin(projects, eq(projects.id, memberships.projectId))
    .innerJoin(organizations, eq(organizations.id, projects.organizationId))
    .where(and(eq(memberships.userId, userId), eq(memberships.role, "owner")))
    .orderBy(asc(projects.createdAt), asc(projects.id))
    .limit(1);
  return row ?? null;
}

/** Whether an organisation has this name. */
export async function organizationNameTaken({ db, name }: { db: Executor; name: string }): Promise<boolean> {
  const [taken] = await db.select({ id: organizations.id }).from(organizations).where(eq(organizations.name, name)).limit(1);
  return Boolean(taken);
}

/** Stores an organisation. */
export async function insertOrganization({ db, name }: { db: Executor; name: string }): Promise<{ id: string; name: string }> {
  const [row] = await db.insert(organizations).values({ name }).returning({ id: organizations.id, name: organizations.name });
  return row;
}

/** Whether the organisation has a project with this name. */
export async function projectNameTaken({ db, organizationId, name }: { db: Executor; organizationId: string; name: string }): Promise<boolean> {
  const [duplicate] = await db
    .select({ id: projects.id })
    .from(projects)
    .where(and(eq(projects.organizationId, organizationId), eq(projects.name, name)))
    .limit(1);
  return Boolean(duplicate);
}

/** Stores a project of an organisation. */
export async function insertProject({ db, organization, values }: { db: Executor; organization: { id: string; name: string }; values: Omit<typeof projects.$inferInsert, "organizationId"> }): Promise<PresentedProject> {
  const [project] = await db.insert(projects).values({ ...values, organizationId: organization.id }).returning();
  return present(project, organization);
}
