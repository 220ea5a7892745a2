// Join links: a one-time token per invitation, of which only a hash is stored, so a leaked database does not leak
// working links.
import { createHash, randomBytes } from "node:crypto";
import type { Role } from "@/lib/permissions";

/** How long a join link stays valid. */
export const INVITATION_TTL_MS = 7 * 24 * 60 * 60 * 1000;

export const INVITATION_USED = "This invitation has already been used. Sign in, or ask the project owner for a new one.";
export const INVITATION_EXPIRED = "This invitation has expired. Ask the project owner for a new one.";

/** A fresh token for a join link. */
export function newInvitationToken(): string {
  return randomBytes(32).toString("base64url");
}

/** What is stored of a token. */
export function hashToken(token: string): string {
  return createHash("sha256").update(token).digest("hex");
}

/** The join page URL for a token. */
export function joinLink(token: string): string {
  const base = process.env.APP_URL ?? process.env.NEXTAUTH_URL ?? "http://127.0.0.1:3000";
  return new URL(`/join/${encodeURIComponent(token)}`, base).toString();
}

/** What the join page needs to know about a token. */
export type InvitationCheck = {
  status: "pending" | "accepted" | "expired";
  email: string;
  role: Role;
  project: { id: string; name: string };
  accountExists: boolean;
};

/** The state of the invitation behind a join link (as read by db/queries/invitations getInvitationByTokenHash). */
export function invitationCheck(
  found: { invitation: { email: string; role: Role; acceptedAt: Date | null; expiresAt: Date }; project: { id: string; name: string }; accountExists: boolean } | null,
  now = new Date(),
): InvitationCheck | null {
  if (!found) return null;
  const { invitation } = found;
  const status = invitation.acceptedAt ? "accepted" : invitation.expiresAt <= now ? "expired" : "pending";
  return { status, email: invitation.email, role: invitation.role, project: found.project, accountExists: found.accountExists };
}
