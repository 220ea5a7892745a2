import "server-only";
import { and, asc, eq } from "drizzle-orm";
import { getDb, withTransaction, type Executor } from "@/db/client";
import { memberships, organizations, projects, type Project } from "@/db/schema";
import { ConflictError, ValidationError } from "@/lib/http/errors";
import { abilitiesOf, type Action, type Role } from "@/lib/permissions";
import type { CreateProjectValues } from "@/lib/projects/schemas";
import { recordAuditEvent } from "./audit";

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

/**
 * Creates a project with its creator as owner, in one transaction with its audit event. Organisation (kept
 * simple on purpose): the user's organisation (getOwnedOrganization) when they have one, and `organizationName`
 * is then ignored; otherwise a new organisation with that name, which is required and must not be taken.
 */
export async function createProject({ userId, input }: { userId: string; input: CreateProjectValues }): Promise<ProjectForMember> {
  return withTransaction(async (tx) => {
    let organization = await getOwnedOrganization({ userId, db: tx });
    if (!organization) {
      const name = input.organizationName ?? "";
      if (!name) throw new ValidationError([{ path: "organizationName", message: "Name your organisation: this is your first project." }]);
      const [taken] = await tx.select({ id: organizations.id }).from(organizations).where(eq(organizations.name, name)).limit(1);
      if (taken) throw new ConflictError("That organisation name is taken.", [{ path: "organizationName", message: "This name is taken: choose another." }]);
      [organization] = await tx.insert(organizations).values({ name }).returning({ id: organizations.id, name: organizations.name });
    }
    const [duplicate] = await tx
      .select({ id: projects.id })
      .from(projects)
      .where(and(eq(projects.organizationId, organization.id), eq(projects.name, input.name)))
      .limit(1);
    if (duplicate) throw new ConflictError("Your organisation already has a project with this name.", [{ path: "name", message: "A project with this name exists." }]);
    const [project] = await tx
      .insert(projects)
      .values({
        organizationId: organization.id,
        name: input.name,
        description: input.description,
        designStandard: input.designStandard,
        combinationStandard: input.combinationStandard,
      })
      .returning();
    await tx.insert(memberships).values({ projectId: project.id, userId, role: "owner" });
    await recordAuditEvent({
      db: tx,
      projectId: project.id,
      actorId: userId,
      action: "project.created",
      subjectType: "project",
      subjectId: project.id,
      details: { name: project.name, organizationId: organization.id, designStandard: project.designStandard, combinationStandard: project.combinationStandard },
    });
    return { ...present(project, organization), role: "owner" as const, abilities: abilitiesOf("owner") };
  });
}
