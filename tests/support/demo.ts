// The seeded demo (scripts/seed) as browser tests use it: its accounts, the Northfield roof project, and a page
// signed in as one of its people.
import { readFileSync } from "node:fs";
import { eq } from "drizzle-orm";
import type { Browser, Page } from "playwright-core";
import { projects } from "@/db/schema";
import { signInAs } from "../e2e/pages/sign-in-page";
import { baseUrl } from "./browser";
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

/**
 * A page in a fresh browser context signed in as the demo account with this role, and the demo project's id: where
 * every browser test on the demo starts. The caller opens the project page it tests.
 */
export async function openDemoProjectAs(
  browser: Browser,
  role: string,
  { viewport = { width: 1280, height: 860 } }: { viewport?: { width: number; height: number } } = {},
): Promise<{ page: Page; projectId: string }> {
  const [page, projectId] = await Promise.all([browser.newContext({ baseURL: baseUrl(), viewport }).then((context) => context.newPage()), demoProjectId()]);
  await signInAs(page, demoAccount(role).email, demoAccounts.password);
  return { page, projectId };
}
