import "server-only";
import { withTransaction } from "@/db/client";
import { getRunWithoutColumns, storeRunColumns } from "@/db/queries/result-columns";
import { encodeResultColumns } from "@/lib/models/result-columns";

/**
 * Gives every analysis run stored before results were kept as columns (migration 0006) its columns, one run per
 * transaction, so the viewer can draw old revisions too. Run by scripts/db-migrate.ts; does nothing once all have them.
 */
export async function backfillResultColumns(): Promise<number> {
  let filled = 0;
  for (;;) {
    const run = await getRunWithoutColumns();
    if (!run) return filled;
    await withTransaction((tx) => storeRunColumns(tx, { runId: run.runId, columns: encodeResultColumns(run.model, run.result, run.review) }));
    filled += 1;
  }
}
