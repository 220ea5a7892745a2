import "server-only";
// Reads the two revisions a comparison needs (models, stored analyses, clashes) and compares them (pure:
// lib/models/compare-revisions.ts). A read, not a write: it lives here because lib/ computation never reads db/.
import { listClashesByRevision } from "@/db/queries/clashes";
import { getRevisionWithResults } from "@/db/queries/models";
import { NotFoundError } from "@/lib/http/errors";
import { compareRevisions, type ComparedRevision, type RevisionComparison } from "@/lib/models/compare-revisions";

async function loadCompared(projectId: string, number: number): Promise<ComparedRevision> {
  const revision = await getRevisionWithResults({ projectId, number });
  if (!revision) throw new NotFoundError(`Revision ${number} does not exist in this project.`);
  const clashes = await listClashesByRevision({ revisionId: revision.id });
  return {
    number,
    model: revision.model,
    result: revision.analysis?.result ?? null,
    review: revision.analysis?.review ?? null,
    clashes: clashes.map(({ clashKey, memberId, runId, status, recheckReason, closedReason }) => ({ clashKey, memberId, runId, status, recheckReason, closedReason })),
  };
}

/** Revision `from` compared with revision `to`; 404 naming the revision that does not exist. */
export async function loadRevisionComparison({ projectId, from, to }: { projectId: string; from: number; to: number }): Promise<RevisionComparison> {
  const [a, b] = await Promise.all([loadCompared(projectId, from), loadCompared(projectId, to)]);
  return compareRevisions(a, b);
}
