import "server-only";
import { and, asc, eq } from "drizzle-orm";
import { getDb, withTransaction, type Executor } from "@/db/client";
import { memberships, users, type Membership } from "@/db/schema";
import { ROLES, type Role } from "@/lib/permissions";
import { ConflictError, NotFoundError } from "@/lib/http/errors";
import { recordAuditEvent } from "./audit";

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

/** Changes a member's role and records it; a project always keeps at least one owner. */
export async function updateMemberRole({ projectId, userId, role, actorId }: { projectId: string; userId: string; role: Role; actorId: string }): Promise<PresentedMember> {
  return withTransaction(async (tx) => {
    // Lock the project's memberships so two concurrent demotions cannot both pass the last-owner check.
    const team = await tx.select().from(memberships).where(eq(memberships.projectId, projectId)).for("update");
    const current = team.find((m) => m.userId === userId);
    if (!current) throw new NotFoundError("That person is not on this project.");
    if (current.role === role) throw new ConflictError(`They already have this role.`, [{ path: "role", message: "This is already their role." }]);
    const owners = team.filter((m) => m.role === "owner").length;
    if (current.role === "owner" && owners <= 1) {
      throw new ConflictError("A project needs at least one owner: make someone else owner first.", [
        { path: "role", message: "A project needs at least one owner." },
      ]);
    }
    await tx.update(memberships).set({ role }).where(eq(memberships.id, current.id));
    await recordAuditEvent({
      db: tx,
      projectId,
      actorId,
      action: "member.role_changed",
      subjectType: "user",
      subjectId: userId,
      details: { from: current.role, to: role },
    });
    const [member] = (await listMembersByProject({ projectId, db: tx })).filter((m) => m.userId === userId);
    return member;
  });
}

/** Removes a member from the project and records it; a project always keeps at least one owner. */
export async function removeMember({ projectId, userId, actorId }: { projectId: string; userId: string; actorId: string }): Promise<void> {
  await withTransaction(async (tx) => {
    // Same lock as updateMemberRole: two concurrent removals cannot both pass the last-owner check.
    const team = await tx.select().from(memberships).where(eq(memberships.projectId, projectId)).for("update");
    const current = team.find((m) => m.userId === userId);
    if (!current) throw new NotFoundError("That person is not on this project.");
    if (current.role === "owner" && team.filter((m) => m.role === "owner").length <= 1) {
      throw new ConflictError("A project needs at least one owner: make someone else owner first.");
    }
    await tx.delete(memberships).where(eq(memberships.id, current.id));
    await recordAuditEvent({ db: tx, projectId, actorId, action: "member.removed", subjectType: "user", subjectId: userId, details: { role: current.role } });
  });
}
