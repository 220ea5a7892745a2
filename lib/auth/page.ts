import "server-only";
import { cache } from "react";
import { forbidden, notFound } from "next/navigation";
import { getProjectById } from "@/db/queries/projects";
import { HttpError } from "@/lib/http/errors";
import { authorize, type Action } from "@/lib/permissions";
import { projectForMember, type ProjectForMember } from "@/lib/projects/for-member";
import { requireMembership } from "./guard";
import { requirePageUser, type SessionUser } from "./session";

/**
 * The signed-in user, their membership and the project, read once per request (React cache): the project layout
 * and the page below it both ask, and share one read. Outsiders and bad ids see "not found", so a page never tells
 * them whether a project exists.
 */
const loadPageProject = cache(async (projectId: string): Promise<{ user: SessionUser; project: ProjectForMember }> => {
  const user = await requirePageUser(`/projects/${projectId}`);
  if (!/^[0-9a-f-]{36}$/i.test(projectId)) notFound();
  try {
    const membership = await requireMembership(user, projectId);
    const project = await getProjectById({ projectId });
    if (!project) notFound();
    return { user, project: projectForMember(project, membership.role) };
  } catch (error) {
    if (error instanceof HttpError) notFound();
    throw error;
  }
});

/**
 * For a project page: signed in (else the sign-in page), then the project guard. Members whose role lacks the
 * action see "not allowed" (403, app/forbidden.tsx), since they already know the project.
 */
export async function requirePageProject(projectId: string, action: Action = "project.read"): Promise<{ user: SessionUser; project: ProjectForMember }> {
  const loaded = await loadPageProject(projectId);
  if (!authorize({ role: loaded.project.role, userId: loaded.user.id }, action)) forbidden();
  return loaded;
}
