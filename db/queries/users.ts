import "server-only";
import { randomBytes } from "node:crypto";
import { eq, sql } from "drizzle-orm";
import { getDb, type Executor } from "@/db/client";
import { users, type User } from "@/db/schema";
import { hashPassword, verifyPassword } from "@/lib/auth/password";

/** What leaves the server about a user: never the password hash. */
export type PresentedUser = { id: string; email: string; name: string };

/** A user row as the browser may see it. */
export function presentUser(user: Pick<User, "id" | "email" | "name">): PresentedUser {
  return { id: user.id, email: user.email, name: user.name };
}

/** The user with this e-mail (case-insensitive), or null. */
export async function getUserByEmail({ email, db = getDb() }: { email: string; db?: Executor }): Promise<User | null> {
  const [row] = await db.select().from(users).where(eq(users.email, email.trim().toLowerCase())).limit(1);
  return row ?? null;
}

/** The user with this id, or null. */
export async function getUserById({ id, db = getDb() }: { id: string; db?: Executor }): Promise<User | null> {
  const [row] = await db.select().from(users).where(eq(users.id, id)).limit(1);
  return row ?? null;
}

/** Creates a user with a bcrypt-hashed password; the e-mail must be new (unique index). */
export async function createUser({ email, name, password, db = getDb() }: { email: string; name: string; password: string; db?: Executor }): Promise<User> {
  const [row] = await db
    .insert(users)
    .values({ email: email.trim().toLowerCase(), name, passwordHash: await hashPassword(password) })
    .returning();
  return row;
}

// A bcrypt hash (same cost) of a random password nobody knows: an unknown e-mail is checked against it, so it costs
// the same time as a known one and the answer time does not tell which e-mails have accounts.
let noAccountHash: Promise<string> | undefined;

/** The user when e-mail and password match, otherwise null (the caller cannot tell which was wrong). */
export async function verifyCredentials({ email, password }: { email: string; password: string }): Promise<(PresentedUser & { sessionVersion: number }) | null> {
  const user = await getUserByEmail({ email });
  noAccountHash ??= hashPassword(randomBytes(16).toString("hex"));
  const matches = await verifyPassword(password, user?.passwordHash ?? (await noAccountHash));
  return user && matches ? { ...presentUser(user), sessionVersion: user.sessionVersion } : null;
}

/** The user's current session version, or null when the user no longer exists. */
export async function getSessionVersion({ userId }: { userId: string }): Promise<number | null> {
  const [row] = await getDb().select({ sessionVersion: users.sessionVersion }).from(users).where(eq(users.id, userId)).limit(1);
  return row?.sessionVersion ?? null;
}

/** Raises the user's session version, ending every session issued before; returns the new version. */
export async function raiseSessionVersion({ userId, db = getDb() }: { userId: string; db?: Executor }): Promise<number | null> {
  const [row] = await db
    .update(users)
    .set({ sessionVersion: sql`${users.sessionVersion} + 1` })
    .where(eq(users.id, userId))
    .returning({ sessionVersion: users.sessionVersion });
  return row?.sessionVersion ?? null;
}

/** Renames the user. */
export async function updateUserName({ userId, name, db = getDb() }: { userId: string; name: string; db?: Executor }): Promise<PresentedUser | null> {
  const [row] = await db.update(users).set({ name }).where(eq(users.id, userId)).returning();
  return row ? presentUser(row) : null;
}

/**
 * Replaces the password when the current one matches and raises the session version in the same write (every
 * session issued before ends); returns the new session version, or null when the current password is wrong.
 */
export async function changePassword({ userId, currentPassword, newPassword }: { userId: string; currentPassword: string; newPassword: string }): Promise<number | null> {
  const user = await getUserById({ id: userId });
  if (!user || !(await verifyPassword(currentPassword, user.passwordHash))) return null;
  const [row] = await getDb()
    .update(users)
    .set({ passwordHash: await hashPassword(newPassword), sessionVersion: sql`${users.sessionVersion} + 1` })
    .where(eq(users.id, userId))
    .returning({ sessionVersion: users.sessionVersion });
  return row?.sessionVersion ?? null;
}
