import type { ClashView } from "@/db/queries/clashes";
import type { RunView } from "@/db/queries/mep";
import type { ClashTableRow } from "@/lib/clash/rows";
import type { AnalysedPattern } from "@/lib/review/analysed-patterns";
import type { Role } from "@/lib/permissions";

/** One row of GET /api/projects/[projectId]/clashes. */
export type ClashRowData = ClashTableRow<ClashView>;

export interface ClashListResponse {
  revision: { id: string; number: number };
  /** The caller (for the two-person rule on openings) and their role. */
  userId: string;
  role: Role;
  team: { userId: string; name: string; role: Role }[];
  clashes: ClashRowData[];
  /** The load cases the verdicts rest on, shown beside "idle"; null for a review that does not list them. */
  analysedPatterns: AnalysedPattern[] | null;
  abilities: { propose: boolean; decide: boolean; assign: boolean; editRuns: boolean; hangServices: boolean };
  caution: string;
}

export interface RunListResponse {
  runs: RunView[];
}

export const clashesQueryKey = (projectId: string, revision: number, lowForce: number) => ["projects", projectId, "clashes", revision, lowForce] as const;
export const runsQueryKey = (projectId: string, revision: number) => ["projects", projectId, "runs", revision] as const;
