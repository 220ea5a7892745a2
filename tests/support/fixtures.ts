// One organisation and project per test file, one user per role plus an outsider, with e-mails unique to the file.
import { randomUUID } from "node:crypto";
import { getDb } from "@/db/client";
import { memberships, organizations, projects, users } from "@/db/schema";
import { hashPassword } from "@/lib/auth/password";
import { ROLES, type Role } from "@/lib/permissions";

export const FIXTURE_PASSWORD = "fixture-password-1";

export type FixtureUser = { id: string; email: string; name: string; password: string };
export type ProjectFixture = {
  organizationId: string;
  projectId: string;
  users: Record<Role | "outsider", FixtureUser>;
};

/** A fresh user with a unique e-mail (the label says which test made it). */
export async function createFixtureUser(label: string, password = FIXTURE_PASSWORD): Promise<FixtureUser> {
  const email = `${label}-${randomUUID().slice(0, 8)}@fixture.test`.toLowerCase();
  const name = `Fixture ${label}`;
  const [row] = await getDb().insert(users).values({ email, name, passwordHash: await hashPassword(password) }).returning();
  return { id: row.id, email, name, password };
}

/** An organisation and a project with one member per role, and an outsider who is on no project. */
export async function createProjectFixture(label: string): Promise<ProjectFixture> {
  const db = getDb();
  const suffix = randomUUID().slice(0, 8);
  const [organization] = await db.insert(organizations).values({ name: `Fixture org ${label} ${suffix}` }).returning();
  const [project] = await db
    .insert(projects)
    .values({ organizationId: organization.id, name: `Fixture roof ${label} ${suffix}`, description: "Test project" })
    .returning();
  const entries = await Promise.all(
    [...ROLES, "outsider" as const].map(async (role) => [role, await createFixtureUser(`${label}-${role}`)] as const),
  );
  const byRole = Object.fromEntries(entries) as ProjectFixture["users"];
  await db.insert(memberships).values(ROLES.map((role) => ({ projectId: project.id, userId: byRole[role].id, role })));
  return { organizationId: organization.id, projectId: project.id, users: byRole };
}
