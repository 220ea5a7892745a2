// Which TanStack Query caches a live invalidation makes stale (the keys the project's pages use).
import type { Invalidation } from "@/lib/realtime/live-events";

/** The query-key prefixes to refetch for one invalidation of a project. */
export function staleQueryKeys(projectId: string, { kind, id }: Invalidation): (readonly unknown[])[] {
  const project = ["projects", projectId] as const;
  switch (kind) {
    case "clash":
      return [[...project, "clashes"], [...project, "clash", id]];
    case "runs":
      return [[...project, "runs"], [...project, "clashes"]];
    case "revision":
      return [[...project, "models"]];
    case "member":
      return [[...project, "members"]];
    case "pins":
      return [[...project, "pins"]];
    case "job":
      return [[...project, "jobs", id]];
    case "report":
      return [[...project, "reports"]];
    case "settings":
      return [[...project, "settings"]];
  }
}
