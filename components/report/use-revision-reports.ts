"use client";
// The finished reports of one revision as the report page lists them: one cached query, refetched when a live event
// of kind "report" says any team member's report was stored (components/live/invalidation.ts).
import { useQuery } from "@tanstack/react-query";
import type { ReportJobView } from "@/db/queries/jobs";
import { apiFetch } from "@/lib/http/fetcher";

export const reportsKey = (projectId: string, revision: number) => ["projects", projectId, "reports", revision] as const;

/** The revision's newest finished reports, starting from the list the server rendered the page with. */
export function useRevisionReports(projectId: string, revision: number, initial: ReportJobView[]): ReportJobView[] {
  const query = useQuery({
    queryKey: reportsKey(projectId, revision),
    queryFn: async () => (await apiFetch<{ reports: ReportJobView[] }>(`/api/projects/${projectId}/report?revision=${revision}`)).reports,
    initialData: initial,
  });
  return query.data;
}
