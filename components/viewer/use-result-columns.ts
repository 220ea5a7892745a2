"use client";
// One result's columns (lib/models/result-columns.ts), fetched once per revision and result and kept: the answer is
// immutable, so switching back to a result already seen draws from memory without a request.
import { useQuery } from "@tanstack/react-query";
import { apiFetchBytes } from "@/lib/http/fetcher";
import { unpackWire, type WireColumns } from "@/lib/models/result-columns";
import { revisionUrls } from "@/lib/models/viewer-urls";

export const resultColumnsQueryKey = (projectId: string, number: number, resultId: string) => ["projects", projectId, "models", number, "columns", resultId] as const;

/** The query of one result's columns: the hook below and the viewer's opening prefetch share it. */
export function resultColumnsQuery(projectId: string, number: number, resultId: string) {
  return {
    queryKey: resultColumnsQueryKey(projectId, number, resultId),
    queryFn: async (): Promise<WireColumns> => {
      const columns = unpackWire(await apiFetchBytes(revisionUrls(projectId, number).resultColumns(resultId)));
      performance.mark("viewer:columns-fetched");
      return columns;
    },
    staleTime: Infinity,
    gcTime: 30 * 60_000,
  };
}

/** The columns of `resultId` (undefined while loading, or when there is no result to fetch). */
export function useResultColumns(projectId: string, number: number, resultId: string | null): { columns: WireColumns | undefined; error: Error | null; retry: () => void } {
  const query = useQuery({ ...resultColumnsQuery(projectId, number, resultId ?? ""), enabled: resultId !== null });
  return { columns: query.data, error: query.error, retry: () => void query.refetch() };
}
