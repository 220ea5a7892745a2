import "server-only";
import { eq } from "drizzle-orm";
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

/** The user when e-mail and password match, otherwise null (the caller cannot tell which was wrong). */
export async function verifyCredentials({ email, password }: { email: string; password: string }): Promise<PresentedUser | null> {
  const user = await getUserByEmail({ email });
  if (!user) return null;
  return (await verifyPassword(password, user.passwordHash)) ? presentUser(user) : null;
}

/** Renames the user. */
export async function updateUserName({ userId, name, db = getDb() }: { userId: string; name: string; db?: Executor }): Promise<PresentedUser | null> {
  const [row] = await db.update(users).set({ name }).where(eq(users.id, userId)).returning();
  return row ? presentUser(row) : null;
}

/** Replaces the password when the current one matches; false when it does not. */
export async function changePassword({ userId, currentPassword, newPassword }: { userId: string; currentPassword: string; newPassword: string }): Promise<boolean> {
  const user = await getUserById({ id: userId });
  if (!user || !(await verifyPassword(currentPassword, user.passwordHash))) return false;
  await getDb().update(users).set({ passwordHash: await hashPassword(newPassword) }).where(eq(users.id, userId));
  return true;
}
