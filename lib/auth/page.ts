import "server-only";
import { forbidden, notFound } from "next/navigation";
import { getProjectById } from "@/db/queries/projects";
import { ForbiddenError, HttpError } from "@/lib/http/errors";
import type { Action } from "@/lib/permissions";
import { projectForMember, type ProjectForMember } from "@/lib/projects/for-member";
import { requireProjectRole } from "./guard";
import { requirePageUser, type SessionUser } from "./session";

/**
 * For a project page: signed in (else the sign-in page), then the project guard. Outsiders see "not found", so a
 * page never tells them whether a project exists; members whose role lacks the action see "not allowed" (403,
 * app/forbidden.tsx), since they already know the project.
 */
export async function requirePageProject(projectId: string, action: Action = "project.read"): Promise<{ user: SessionUser; project: ProjectForMember }> {
  const user = await requirePageUser(`/projects/${projectId}`);
  if (!/^[0-9a-f-]{36}$/i.test(projectId)) notFound();
  try {
    const membership = await requireProjectRole(user, projectId, action);
    const project = await getProjectById({ projectId });
    if (!project) notFound();
    return { user, project: projectForMember(project, membership.role) };
  } catch (error) {
    if (error instanceof ForbiddenError) forbidden();
    if (error instanceof HttpError) notFound();
    throw error;
  }
}
