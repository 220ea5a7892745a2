"use client";
// The project's settings as every open page shows them (the deflection limit span/N): one cached query, refetched
// when a live event of kind "settings" says an owner or structural engineer changed them (components/live/invalidation.ts).
import { useQuery } from "@tanstack/react-query";
import type { ProjectForMember } from "@/lib/projects/for-member";
import type { ProjectSettings } from "@/lib/projects/schemas";
import { apiFetch } from "@/lib/http/fetcher";

export const settingsKey = (projectId: string) => ["projects", projectId, "settings"] as const;

/** The project's settings; `initial` is what the server rendered the page with (undefined: fetched on mount). */
export function useProjectSettings(projectId: string, initial?: ProjectSettings) {
  return useQuery({
    queryKey: settingsKey(projectId),
    queryFn: async (): Promise<ProjectSettings> => {
      const { project } = await apiFetch<{ project: ProjectForMember }>(`/api/projects/${projectId}`);
      return { deflectionLimit: project.deflectionLimit };
    },
    initialData: initial,
  });
}
