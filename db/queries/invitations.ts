import "server-only";
import { and, desc, eq, gt, isNull } from "drizzle-orm";
import { getDb, type Executor, type Transaction } from "@/db/client";
import { invitations, memberships, projects, users, type Invitation } from "@/db/schema";

type Role = Invitation["role"];

export type PresentedInvitation = {
  id: string;
  email: string;
  role: Role;
  expiresAt: string;
  acceptedAt: string | null;
  createdAt: string;
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

/** Whether someone with this (normalised) e-mail is on the project's team. */
export async function isEmailOnTeam({ db, projectId, email }: { db: Executor; projectId: string; email: string }): Promise<boolean> {
  const [member] = await db
    .select({ id: memberships.id })
    .from(memberships)
    .innerJoin(users, eq(users.id, memberships.userId))
    .where(and(eq(memberships.projectId, projectId), eq(users.email, email)))
    .limit(1);
  return Boolean(member);
}

/** Whether an invitation to this e-mail is neither accepted nor expired. */
export async function hasPendingInvitation({ db, projectId, email, now }: { db: Executor; projectId: string; email: string; now: Date }): Promise<boolean> {
  const [pending] = await db
    .select({ id: invitations.id })
    .from(invitations)
    .where(and(eq(invitations.projectId, projectId), eq(invitations.email, email), isNull(invitations.acceptedAt), gt(invitations.expiresAt, now)))
    .limit(1);
  return Boolean(pending);
}

/** Stores an invitation. */
export async function insertInvitation({ db, values }: { db: Executor; values: typeof invitations.$inferInsert }): Promise<Invitation> {
  const [row] = await db.insert(invitations).values(values).returning();
  return row;
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

/** An invitation of the project, locked until the transaction ends, or null. */
export async function lockInvitation({ db, projectId, invitationId }: { db: Transaction; projectId: string; invitationId: string }): Promise<Invitation | null> {
  const [row] = await db
    .select()
    .from(invitations)
    .where(and(eq(invitations.id, invitationId), eq(invitations.projectId, projectId)))
    .for("update")
    .limit(1);
  return row ?? null;
}

/** The invitation with this token hash, locked until the transaction ends, or null. */
export async function lockInvitationByTokenHash({ db, tokenHash }: { db: Transaction; tokenHash: string }): Promise<Invitation | null> {
  const [row] = await db.select().from(invitations).where(eq(invitations.tokenHash, tokenHash)).for("update").limit(1);
  return row ?? null;
}

/** Removes an invitation (its join link stops working). */
export async function deleteInvitation({ db, invitationId }: { db: Executor; invitationId: string }): Promise<void> {
  await db.delete(invitations).where(eq(invitations.id, invitationId));
}

/** Marks an invitation used by a user. */
export async function markInvitationAccepted({ db, invitationId, userId, at }: { db: Executor; invitationId: string; userId: string; at: Date }): Promise<void> {
  await db.update(invitations).set({ acceptedAt: at, acceptedBy: userId }).where(eq(invitations.id, invitationId));
}

/** The invitation with this token hash with its project and whether its e-mail has an account, or null. */
export async function getInvitationByTokenHash({ tokenHash, db = getDb() }: { tokenHash: string; db?: Executor }) {
  const [row] = await db
    .select({ invitation: invitations, project: { id: projects.id, name: projects.name } })
    .from(invitations)
    .innerJoin(projects, eq(projects.id, invitations.projectId))
    .where(eq(invitations.tokenHash, tokenHash))
    .limit(1);
  if (!row) return null;
  const [account] = await db.select({ id: users.id }).from(users).where(eq(users.email, row.invitation.email)).limit(1);
  return { ...row, accountExists: Boolean(account) };
}
