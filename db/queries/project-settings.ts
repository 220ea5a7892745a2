import "server-only";
import { eq } from "drizzle-orm";
import type { Executor } from "@/db/client";
import { projects } from "@/db/schema";
import type { ProjectSettings } from "@/lib/projects/schemas";

/** The project's settings, locked until the caller's transaction ends (a concurrent change waits), or null. */
export async function lockProjectSettings({ projectId, db }: { projectId: string; db: Executor }): Promise<ProjectSettings | null> {
  const [row] = await db.select({ deflectionLimit: projects.deflectionLimit }).from(projects).where(eq(projects.id, projectId)).for("update").limit(1);
  return row ?? null;
}

/** Stores the project's settings. */
export async function setProjectSettings({ projectId, settings, db }: { projectId: string; settings: ProjectSettings; db: Executor }): Promise<void> {
  await db.update(projects).set(settings).where(eq(projects.id, projectId));
}
