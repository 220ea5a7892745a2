import "server-only";
import { and, asc, eq } from "drizzle-orm";
import { getDb, type Executor } from "@/db/client";
import { memberships, users, type Membership } from "@/db/schema";
import { ROLES, type Role } from "@/lib/permissions";

export type PresentedMember = { userId: string; name: string; email: string; role: Role; joinedAt: string };

/** The user's membership of the project, or null when they are not on it. */
export async function getMembership({ projectId, userId, db = getDb() }: { projectId: string; userId: string; db?: Executor }): Promise<Membership | null> {
  const [row] = await db
    .select()
    .from(memberships)
    .where(and(eq(memberships.projectId, projectId), eq(memberships.userId, userId)))
    .limit(1);
  return row ?? null;
}

/** One member of the project with their name and e-mail (as listMembersByProject gives them), or null. */
export async function getProjectMember({ projectId, userId, db = getDb() }: { projectId: string; userId: string; db?: Executor }): Promise<PresentedMember | null> {
  const [row] = await db
    .select({ userId: users.id, name: users.name, email: users.email, role: memberships.role, joinedAt: memberships.createdAt })
    .from(memberships)
    .innerJoin(users, eq(users.id, memberships.userId))
    .where(and(eq(memberships.projectId, projectId), eq(memberships.userId, userId)));
  return row ? { ...row, joinedAt: row.joinedAt.toISOString() } : null;
}

/** The project's team, ordered by role (owner first) then name. */
export async function listMembersByProject({ projectId, db = getDb() }: { projectId: string; db?: Executor }): Promise<PresentedMember[]> {
  const rows = await db
    .select({ userId: users.id, name: users.name, email: users.email, role: memberships.role, joinedAt: memberships.createdAt })
    .from(memberships)
    .innerJoin(users, eq(users.id, memberships.userId))
    .where(eq(memberships.projectId, projectId))
    .orderBy(asc(users.name));
  return rows
    .map((row) => ({ ...row, joinedAt: row.joinedAt.toISOString() }))
    .sort((a, b) => ROLES.indexOf(a.role) - ROLES.indexOf(b.role));
}

/** Adds the user to the project with a role (inside the caller's transaction when one is given). */
export async function addMember({ projectId, userId, role, db = getDb() }: { projectId: string; userId: string; role: Role; db?: Executor }): Promise<Membership> {
  const [row] = await db.insert(memberships).values({ projectId, userId, role }).returning();
  return row;
}

/** The project's memberships, locked until the transaction ends (so two concurrent team changes see each other). */
export function lockTeam({ projectId, db }: { projectId: string; db: Executor }): Promise<Membership[]> {
  return db.select().from(memberships).where(eq(memberships.projectId, projectId)).for("update");
}

/** Sets one membership's role. */
export async function setMembershipRole({ membershipId, role, db }: { membershipId: string; role: Role; db: Executor }): Promise<void> {
  await db.update(memberships).set({ role }).where(eq(memberships.id, membershipId));
}

/** Deletes one membership. */
export async function deleteMembership({ membershipId, db }: { membershipId: string; db: Executor }): Promise<void> {
  await db.delete(memberships).where(eq(memberships.id, membershipId));
}
