import "server-only";
import type { Executor } from "@/db/client";
import { lockClash } from "@/db/queries/clashes";
import { getLatestAnalysisForRevision } from "@/db/queries/mep";
import { getRevisionNumber } from "@/db/queries/models";
import type { ClashRow } from "@/db/schema";
import { NotFoundError } from "@/lib/http/errors";
import type { Role } from "@/lib/permissions";

/** Who acts on a clash: the signed-in member, with the role they hold on the project now. */
export type ClashActor = { userId: string; role: Role };

/**
 * Locks the clash for the rest of the transaction and names the result set it is judged on (the newest analysis
 * of its revision), which every entry of its history records, and its revision's number for the live event.
 */
export async function lockClashForStep(tx: Executor, projectId: string, clashId: string): Promise<{ clash: ClashRow; analysisRunId: string | null; revision: number | null }> {
  const clash = await lockClash(tx, { projectId, clashId });
  if (!clash) throw new NotFoundError("No such clash on this project.");
  const [analysis, revision] = await Promise.all([
    getLatestAnalysisForRevision({ revisionId: clash.revisionId, db: tx }),
    getRevisionNumber({ revisionId: clash.revisionId, db: tx }),
  ]);
  return { clash, analysisRunId: analysis?.id ?? null, revision };
}
