// The seeded demo (scripts/seed) as browser tests use it: its accounts and the Northfield roof project.
import { readFileSync } from "node:fs";
import { eq } from "drizzle-orm";
import { projects } from "@/db/schema";
import { getDb } from "./db";

export const DEMO_PROJECT = "Northfield Community Sports Hall — roof";

export const demoAccounts = JSON.parse(readFileSync(new URL("../../scripts/seed/demo-accounts.json", import.meta.url), "utf8")) as {
  password: string;
  users: { email: string; name: string; role: string }[];
};

/** The demo account with this role. */
export function demoAccount(role: string): { email: string; name: string; role: string } {
  const account = demoAccounts.users.find((u) => u.role === role);
  if (!account) throw new Error(`scripts/seed/demo-accounts.json has no ${role} account.`);
  return account;
}

/** The seeded demo project's id. */
export async function demoProjectId(): Promise<string> {
  const [project] = await getDb().select({ id: projects.id }).from(projects).where(eq(projects.name, DEMO_PROJECT));
  if (!project) throw new Error(`The demo project "${DEMO_PROJECT}" is not in the database; run the seed first.`);
  return project.id;
}
