import "server-only";
import { lockProjectSettings, setProjectSettings } from "@/db/queries/project-settings";
import { NotFoundError } from "@/lib/http/errors";
import type { ProjectSettings } from "@/lib/projects/schemas";
import { runCommand } from "./command";

/**
 * An owner or structural engineer changes the project's settings (the deflection limit span/N). Audited with the
 * values before and after. Stored reviews keep the limit they were made with: the new one applies from the next
 * analysis (server/jobs/analysis.ts reads it when the job runs). Open pages hear of it (a live event of kind
 * "settings") and show the new limit without a reload. Changing to the same value writes nothing.
 */
export function changeProjectSettings({ projectId, settings, actorId }: { projectId: string; settings: ProjectSettings; actorId: string }): Promise<ProjectSettings> {
  return runCommand(async ({ tx, audit, live }) => {
    const before = await lockProjectSettings({ projectId, db: tx });
    if (!before) throw new NotFoundError();
    if (before.deflectionLimit === settings.deflectionLimit) return before;
    await setProjectSettings({ projectId, settings, db: tx });
    await audit({ projectId, actorId, action: "project.settings_changed", subjectType: "project", subjectId: projectId, details: { from: before, to: settings } });
    await live({ projectId, kind: "settings", subjectId: projectId });
    return settings;
  });
}
