// The demo organisation, project and one account per role (scripts/seed/demo-accounts.json), in our invented scenario.
// Idempotent: running it again updates names and roles in place and never duplicates rows.
import { readFileSync } from "node:fs";
import { and, eq } from "drizzle-orm";
import type { Executor } from "../../db/client";
import { memberships, organizations, projects, users } from "../../db/schema";
import { hashPassword, verifyPassword } from "../../lib/auth/password";
import { isRole, type Role } from "../../lib/permissions";

export const DEMO_ORGANIZATION = "Northfield Design Collective";
export const DEMO_PROJECT = "Northfield Community Sports Hall — roof";
export const DEMO_DESIGN_STANDARD = "EN1993-1-1" as const;
const DEMO_DESCRIPTION =
  "Double-layer steel grid roof over the main hall of the Northfield community sports hall: structural, architectural and MEP review.";

export type DemoAccounts = { password: string; users: { email: string; name: string; role: Role }[] };

/** The demo sign-ins, read from the JSON file that `npm start` also prints. */
export function readDemoAccounts(): DemoAccounts {
  const raw = JSON.parse(readFileSync(new URL("./demo-accounts.json", import.meta.url), "utf8")) as DemoAccounts;
  for (const user of raw.users) if (!isRole(user.role)) throw new Error(`demo-accounts.json: unknown role "${user.role}" for ${user.email}.`);
  return raw;
}

/** Creates (or finds) the demo organisation and project; returns their ids for the other seed steps. */
export async function seedDemoProject(db: Executor): Promise<{ organizationId: string; projectId: string }> {
  const [organization] = await db
    .insert(organizations)
    .values({ name: DEMO_ORGANIZATION })
    .onConflictDoUpdate({ target: organizations.name, set: { name: DEMO_ORGANIZATION } })
    .returning();
  const [project] = await db
    .insert(projects)
    .values({ organizationId: organization.id, name: DEMO_PROJECT, description: DEMO_DESCRIPTION, designStandard: DEMO_DESIGN_STANDARD, combinationStandard: "EN1990" })
    .onConflictDoUpdate({ target: [projects.organizationId, projects.name], set: { description: DEMO_DESCRIPTION } })
    .returning();
  return { organizationId: organization.id, projectId: project.id };
}

/** One demo user per role on the demo project; returns each user's id by role. */
export async function seedDemoTeam(db: Executor, projectId: string): Promise<Record<Role, string>> {
  const accounts = readDemoAccounts();
  const ids = {} as Record<Role, string>;
  for (const account of accounts.users) {
    const [existing] = await db.select().from(users).where(eq(users.email, account.email)).limit(1);
    let userId: string;
    if (existing) {
      userId = existing.id;
      // Restore the documented password if someone changed it while trying the demo.
      const passwordHash = (await verifyPassword(accounts.password, existing.passwordHash)) ? existing.passwordHash : await hashPassword(accounts.password);
      await db.update(users).set({ name: account.name, passwordHash }).where(eq(users.id, userId));
    } else {
      const [created] = await db.insert(users).values({ email: account.email, name: account.name, passwordHash: await hashPassword(accounts.password) }).returning();
      userId = created.id;
    }
    await db
      .insert(memberships)
      .values({ projectId, userId, role: account.role })
      .onConflictDoUpdate({ target: [memberships.projectId, memberships.userId], set: { role: account.role } });
    ids[account.role] = userId;
  }
  const [check] = await db.select().from(memberships).where(and(eq(memberships.projectId, projectId), eq(memberships.role, "owner"))).limit(1);
  if (!check) throw new Error("The demo project has no owner after seeding.");
  return ids;
}
