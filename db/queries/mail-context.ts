import "server-only";
// What the mails of lib/commands/mail.ts read to address and word themselves. SQL only.
import { and, eq, inArray } from "drizzle-orm";
import type { Executor } from "@/db/client";
import { clashes, comments, invitations, memberships, pins, projects, users } from "@/db/schema";

/** An invitation with its project's name and the inviter's name, or null. */
export async function getInvitationMailFacts({ db, invitationId }: { db: Executor; invitationId: string }) {
  const [row] = await db
    .select({ invitation: invitations, projectName: projects.name, inviterName: users.name })
    .from(invitations)
    .innerJoin(projects, eq(projects.id, invitations.projectId))
    .innerJoin(users, eq(users.id, invitations.invitedBy))
    .where(eq(invitations.id, invitationId));
  return row ?? null;
}

/** A pin of the project with its title, author and the project's name, or null. */
export async function getPinMailFacts({ db, projectId, pinId }: { db: Executor; projectId: string; pinId: string }) {
  const [row] = await db
    .select({ title: pins.title, authorId: pins.authorId, projectName: projects.name })
    .from(pins)
    .innerJoin(projects, eq(projects.id, pins.projectId))
    .where(and(eq(pins.id, pinId), eq(pins.projectId, projectId)));
  return row ?? null;
}

/** Everyone who wrote in a pin's thread. */
export async function listThreadWriterIds({ db, pinId }: { db: Executor; pinId: string }): Promise<string[]> {
  const rows = await db.selectDistinct({ userId: comments.authorId }).from(comments).where(eq(comments.pinId, pinId));
  return rows.map((r) => r.userId);
}

/** The e-mail addresses of those of `userIds` who are on the project's team. */
export async function listMemberContacts({ db, projectId, userIds }: { db: Executor; projectId: string; userIds: string[] }): Promise<{ userId: string; email: string }[]> {
  if (userIds.length === 0) return [];
  return db
    .select({ userId: users.id, email: users.email })
    .from(memberships)
    .innerJoin(users, eq(users.id, memberships.userId))
    .where(and(eq(memberships.projectId, projectId), inArray(memberships.userId, userIds)));
}

/** How a mail names a clash, or null. */
export async function getClashMailFacts({ db, clashId }: { db: Executor; clashId: string }) {
  const [row] = await db.select({ clashKey: clashes.clashKey, memberId: clashes.memberId, runId: clashes.runId }).from(clashes).where(eq(clashes.id, clashId));
  return row ?? null;
}

/** A user's name, or null. */
export async function getUserName({ db, userId }: { db: Executor; userId: string }): Promise<string | null> {
  const [row] = await db.select({ name: users.name }).from(users).where(eq(users.id, userId));
  return row?.name ?? null;
}

/** A project's name, or null. */
export async function getProjectName({ db, projectId }: { db: Executor; projectId: string }): Promise<string | null> {
  const [row] = await db.select({ name: projects.name }).from(projects).where(eq(projects.id, projectId));
  return row?.name ?? null;
}

/** The members of a project who hold a role (the structural engineers decide clash proposals). */
export async function listUserIdsWithRole({ db, projectId, role }: { db: Executor; projectId: string; role: (typeof memberships.$inferSelect)["role"] }): Promise<string[]> {
  const rows = await db
    .select({ userId: memberships.userId })
    .from(memberships)
    .where(and(eq(memberships.projectId, projectId), eq(memberships.role, role)));
  return rows.map((r) => r.userId);
}
