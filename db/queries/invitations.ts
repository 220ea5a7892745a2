import "server-only";
import { createHash, randomBytes } from "node:crypto";
import { and, desc, eq, gt, isNull } from "drizzle-orm";
import { getDb, withTransaction, type Executor } from "@/db/client";
import { invitations, memberships, projects, users, type Invitation } from "@/db/schema";
import type { Role } from "@/lib/permissions";
import { ConflictError, ForbiddenError, GoneError, NotFoundError, UnauthorizedError } from "@/lib/http/errors";
import { sendInvitationMail } from "@/lib/mail/notify";
import { recordAuditEvent } from "./audit";
import { createUser, presentUser, type PresentedUser } from "./users";

/** How long a join link stays valid. */
export const INVITATION_TTL_MS = 7 * 24 * 60 * 60 * 1000;

export type PresentedInvitation = {
  id: string;
  email: string;
  role: Role;
  expiresAt: string;
  acceptedAt: string | null;
  createdAt: string;
};

/** What the join page needs to know about a token. */
export type InvitationCheck = {
  status: "pending" | "accepted" | "expired";
  email: string;
  role: Role;
  project: { id: string; name: string };
  accountExists: boolean;
};

export function presentInvitation(invitation: Invitation): PresentedInvitation {
  return {
    id: invitation.id,
    email: invitation.email,
    role: invitation.role,
    expiresAt: invitation.expiresAt.toISOString(),
    acceptedAt: invitation.acceptedAt?.toISOString() ?? null,
    createdAt: invitation.createdAt.toISOString(),
  };
}

/** Only a hash of each token is stored, so a leaked database does not leak working join links. */
export function hashToken(token: string): string {
  return createHash("sha256").update(token).digest("hex");
}

/** The join page URL for a token. */
export function joinLink(token: string): string {
  const base = process.env.APP_URL ?? process.env.NEXTAUTH_URL ?? "http://127.0.0.1:3000";
  return new URL(`/join/${encodeURIComponent(token)}`, base).toString();
}

/**
 * Creates an invitation and returns it with the one-time token of its join link (see joinLink); the mail helper
 * sends the link. Refuses an e-mail already on the team or already holding a pending invitation.
 */
export async function createInvitation({ projectId, email, role, invitedBy }: { projectId: string; email: string; role: Role; invitedBy: string }): Promise<{ invitation: PresentedInvitation; token: string }> {
  const normalised = email.trim().toLowerCase();
  return withTransaction(async (tx) => {
    const [member] = await tx
      .select({ id: memberships.id })
      .from(memberships)
      .innerJoin(users, eq(users.id, memberships.userId))
      .where(and(eq(memberships.projectId, projectId), eq(users.email, normalised)))
      .limit(1);
    if (member) throw new ConflictError("This person is already on the team.", [{ path: "email", message: "Already on the team." }]);
    const [pending] = await tx
      .select({ id: invitations.id })
      .from(invitations)
      .where(and(eq(invitations.projectId, projectId), eq(invitations.email, normalised), isNull(invitations.acceptedAt), gt(invitations.expiresAt, new Date())))
      .limit(1);
    if (pending) throw new ConflictError("An invitation to this e-mail is still pending.", [{ path: "email", message: "An invitation is already pending." }]);

    const token = randomBytes(32).toString("base64url");
    const [row] = await tx
      .insert(invitations)
      .values({ projectId, email: normalised, role, invitedBy, tokenHash: hashToken(token), expiresAt: new Date(Date.now() + INVITATION_TTL_MS) })
      .returning();
    await recordAuditEvent({ db: tx, projectId, actorId: invitedBy, action: "invitation.created", subjectType: "invitation", subjectId: row.id, details: { email: normalised, role } });
    await sendInvitationMail({ db: tx, invitationId: row.id, joinUrl: joinLink(token) });
    return { invitation: presentInvitation(row), token };
  });
}

/** The project's invitations that are neither accepted nor expired, newest first. */
export async function listPendingInvitations({ projectId, db = getDb() }: { projectId: string; db?: Executor }): Promise<PresentedInvitation[]> {
  const rows = await db
    .select()
    .from(invitations)
    .where(and(eq(invitations.projectId, projectId), isNull(invitations.acceptedAt), gt(invitations.expiresAt, new Date())))
    .orderBy(desc(invitations.createdAt));
  return rows.map(presentInvitation);
}

/** Cancels a pending invitation of the project (its join link stops working) and records it. */
export async function cancelInvitation({ projectId, invitationId, actorId }: { projectId: string; invitationId: string; actorId: string }): Promise<void> {
  await withTransaction(async (tx) => {
    const [invitation] = await tx
      .select()
      .from(invitations)
      .where(and(eq(invitations.id, invitationId), eq(invitations.projectId, projectId)))
      .for("update")
      .limit(1);
    if (!invitation) throw new NotFoundError("No such invitation on this project.");
    if (invitation.acceptedAt) throw new ConflictError("This invitation has already been accepted: remove the member instead.");
    await tx.delete(invitations).where(eq(invitations.id, invitation.id));
    await recordAuditEvent({
      db: tx,
      projectId,
      actorId,
      action: "invitation.cancelled",
      subjectType: "invitation",
      subjectId: invitation.id,
      details: { email: invitation.email, role: invitation.role },
    });
  });
}

/** The state of the invitation behind a join link, or null for an unknown token. */
export async function checkInvitation({ token }: { token: string }): Promise<InvitationCheck | null> {
  const db = getDb();
  const [row] = await db
    .select({ invitation: invitations, project: { id: projects.id, name: projects.name } })
    .from(invitations)
    .innerJoin(projects, eq(projects.id, invitations.projectId))
    .where(eq(invitations.tokenHash, hashToken(token)))
    .limit(1);
  if (!row) return null;
  const [account] = await db.select({ id: users.id }).from(users).where(eq(users.email, row.invitation.email)).limit(1);
  const status = row.invitation.acceptedAt ? "accepted" : row.invitation.expiresAt <= new Date() ? "expired" : "pending";
  return { status, email: row.invitation.email, role: row.invitation.role, project: row.project, accountExists: Boolean(account) };
}

export const INVITATION_USED = "This invitation has already been used. Sign in, or ask the project owner for a new one.";
export const INVITATION_EXPIRED = "This invitation has expired. Ask the project owner for a new one.";

/**
 * Accepts an invitation in one transaction: marks it used, creates the account when `newAccount` is given (the
 * e-mail must be new) or uses the signed-in `userId` (whose e-mail must match), adds the membership and records it.
 */
export async function acceptInvitation({ token, userId, newAccount }: { token: string; userId?: string; newAccount?: { name: string; password: string } }): Promise<{ user: PresentedUser; projectId: string }> {
  return withTransaction(async (tx) => {
    const [invitation] = await tx.select().from(invitations).where(eq(invitations.tokenHash, hashToken(token))).for("update").limit(1);
    if (!invitation) throw new NotFoundError("This invitation link is not valid.");
    if (invitation.acceptedAt) throw new GoneError(INVITATION_USED);
    if (invitation.expiresAt <= new Date()) throw new GoneError(INVITATION_EXPIRED);

    const [existing] = await tx.select().from(users).where(eq(users.email, invitation.email)).limit(1);
    let user;
    if (existing) {
      if (!userId) throw new UnauthorizedError(`An account for ${invitation.email} already exists: sign in to accept.`);
      if (existing.id !== userId) throw new ForbiddenError(`This invitation is for ${invitation.email}: sign in with that account.`);
      user = existing;
    } else {
      if (userId) throw new ForbiddenError(`This invitation is for ${invitation.email}: sign out, then open the link again.`);
      if (!newAccount) throw new UnauthorizedError("Choose your name and a password to join.");
      user = await createUser({ db: tx, email: invitation.email, ...newAccount });
    }

    const [already] = await tx
      .select({ id: memberships.id })
      .from(memberships)
      .where(and(eq(memberships.projectId, invitation.projectId), eq(memberships.userId, user.id)))
      .limit(1);
    if (already) throw new ConflictError("You are already on this project.");
    await tx.insert(memberships).values({ projectId: invitation.projectId, userId: user.id, role: invitation.role });
    await tx.update(invitations).set({ acceptedAt: new Date(), acceptedBy: user.id }).where(eq(invitations.id, invitation.id));
    await recordAuditEvent({
      db: tx,
      projectId: invitation.projectId,
      actorId: user.id,
      action: "invitation.accepted",
      subjectType: "invitation",
      subjectId: invitation.id,
      details: { email: invitation.email, role: invitation.role, newAccount: !existing },
    });
    return { user: presentUser(user), projectId: invitation.projectId };
  });
}
