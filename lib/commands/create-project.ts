import "server-only";
import { addMember } from "@/db/queries/memberships";
import { getOwnedOrganization, insertOrganization, insertProject, organizationNameTaken, projectNameTaken } from "@/db/queries/projects";
import { ConflictError, ValidationError } from "@/lib/http/errors";
import { projectForMember, type ProjectForMember } from "@/lib/projects/for-member";
import type { CreateProjectValues } from "@/lib/projects/schemas";
import { runCommand } from "./command";

/**
 * Creates a project with its creator as owner. Organisation (kept simple on purpose): the user's organisation
 * (getOwnedOrganization) when they have one, and `organizationName` is then ignored; otherwise a new organisation
 * with that name, which is required and must not be taken.
 */
export async function createProject({ userId, input }: { userId: string; input: CreateProjectValues }): Promise<ProjectForMember> {
  return runCommand(async ({ tx, audit }) => {
    let organization = await getOwnedOrganization({ userId, db: tx });
    if (!organization) {
      const name = input.organizationName ?? "";
      if (!name) throw new ValidationError([{ path: "organizationName", message: "Name your organisation: this is your first project." }]);
      if (await organizationNameTaken({ db: tx, name })) throw new ConflictError("That organisation name is taken.", [{ path: "organizationName", message: "This name is taken: choose another." }]);
      organization = await insertOrganization({ db: tx, name });
    }
    if (await projectNameTaken({ db: tx, organizationId: organization.id, name: input.name })) {
      throw new ConflictError("Your organisation already has a project with this name.", [{ path: "name", message: "A project with this name exists." }]);
    }
    const project = await insertProject({
      db: tx,
      organization,
      values: { name: input.name, description: input.description, designStandard: input.designStandard, combinationStandard: input.combinationStandard },
    });
    await addMember({ projectId: project.id, userId, role: "owner", db: tx });
    await audit({
      projectId: project.id,
      actorId: userId,
      action: "project.created",
      subjectType: "project",
      subjectId: project.id,
      details: { name: project.name, organizationId: organization.id, designStandard: project.designStandard, combinationStandard: project.combinationStandard },
    });
    return projectForMember(project, "owner");
  });
}
