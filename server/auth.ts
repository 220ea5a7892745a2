// Who is connecting: the next-auth session cookie (the web app's sign-in) and the member's role in the project.
// Both the socket.io handshake and the Yjs upgrade go through authenticate().
import type { IncomingHttpHeaders } from "node:http";
import { z } from "zod";
import { getMembership } from "@/db/queries/memberships";
import { isSameSite } from "@/lib/http/same-origin";
import { verifySessionCookie, type SessionUser } from "@/lib/auth/session-cookie";
import { authorize, type Asker, type Role } from "@/lib/permissions";

export type Connected = { user: SessionUser; role: Role; projectId: string };

export type Refusal = { status: 400 | 401 | 403 | 404; message: string };

const projectIdSchema = z.uuid();

/** The connecting member, or why they are refused (signed out 401, not on the team 404, no read right 403). */
export async function authenticate(cookieHeader: string | undefined, projectId: unknown): Promise<Connected | Refusal> {
  const parsedProject = projectIdSchema.safeParse(projectId);
  if (!parsedProject.success) return { status: 400, message: "A project id is required." };
  const user = await verifySessionCookie(cookieHeader);
  if (!user) return { status: 401, message: "Sign in to continue." };
  const membership = await getMembership({ projectId: parsedProject.data, userId: user.id });
  if (!membership) return { status: 404, message: "No such project, or you are not on its team." };
  if (!authorize(membership, "project.read")) return { status: 403, message: "Your role on this project does not allow this." };
  return { user, role: membership.role, projectId: parsedProject.data };
}

/** True when authenticate() refused the connection. */
export function isRefusal(result: Connected | Refusal): result is Refusal {
  return "status" in result;
}

/** The member as the rule book sees them now (re-read before every write, so a role change applies at once). */
export async function currentMember({ projectId, userId }: { projectId: string; userId: string }): Promise<Asker> {
  return (await getMembership({ projectId, userId })) ?? null;
}

/** Browsers must come from the web app (lib/http/same-origin.ts); clients without Origin (Node, tests) are not browsers. */
export function isAllowedOrigin(headers: IncomingHttpHeaders, appUrl: string): boolean {
  const secFetchSite = headers["sec-fetch-site"];
  return isSameSite({ origin: headers.origin, secFetchSite: Array.isArray(secFetchSite) ? secFetchSite[0] : secFetchSite }, [new URL(appUrl).origin]);
}
