import "server-only";
import { getMembership } from "@/db/queries/memberships";
import type { Membership } from "@/db/schema";
import { ForbiddenError, NotFoundError, UnauthorizedError } from "@/lib/http/errors";
import { can, type Action } from "@/lib/permissions";
import type { SessionUser } from "./session-cookie";

/**
 * The one project guard: signed in (401), member of the project (404, so outsiders cannot probe which projects
 * exist) and a role that may perform the action (403). Returns the membership.
 */
export async function requireProjectRole(user: SessionUser | null, projectId: string, action: Action): Promise<Membership> {
  if (!user) throw new UnauthorizedError();
  const membership = await getMembership({ projectId, userId: user.id });
  if (!membership) throw new NotFoundError("No such project, or you are not on its team.");
  if (!can(membership.role, action)) throw new ForbiddenError();
  return membership;
}

/** Signed in, or a 401. */
export function requireUser(user: SessionUser | null): SessionUser {
  if (!user) throw new UnauthorizedError();
  return user;
}
