import "server-only";
import { getMembership } from "@/db/queries/memberships";
import type { Membership } from "@/db/schema";
import { ForbiddenError, NotFoundError, UnauthorizedError } from "@/lib/http/errors";
import { authorize, type Action } from "@/lib/permissions";
import type { SessionUser } from "./session-cookie";

/** The signed-in user's membership of the project (read once per request), or a 404 for outsiders. */
export async function requireMembership(user: SessionUser, projectId: string): Promise<Membership> {
  const membership = await getMembership({ projectId, userId: user.id });
  if (!membership) throw new NotFoundError("No such project, or you are not on its team.");
  return membership;
}

/**
 * The one project guard: signed in (401), member of the project (404, so outsiders cannot probe which projects
 * exist) and a role the rule book allows the action (403). Returns the membership.
 */
export async function requireProjectRole(user: SessionUser | null, projectId: string, action: Action): Promise<Membership> {
  const membership = await requireMembership(requireUser(user), projectId);
  if (!authorize(membership, action)) throw new ForbiddenError();
  return membership;
}

/** Signed in, or a 401. */
export function requireUser(user: SessionUser | null): SessionUser {
  if (!user) throw new UnauthorizedError();
  return user;
}
