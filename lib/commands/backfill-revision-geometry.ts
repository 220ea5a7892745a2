import "server-only";
import { getDb } from "@/db/client";
import { getRevisionWithoutGeometry, storeRevisionGeometry } from "@/db/queries/models";
import { packGeometry } from "@/lib/models/geometry-wire";

/**
 * Gives every revision saved before the viewer geometry was stored with it (migration 0019) its geometry, one
 * revision at a time, so the viewer opens old revisions without packing their model on every request. Run by
 * scripts/db-migrate.ts; does nothing once all have it.
 */
export async function backfillRevisionGeometry(): Promise<number> {
  let filled = 0;
  for (;;) {
    const revision = await getRevisionWithoutGeometry();
    if (!revision) return filled;
    await storeRevisionGeometry(getDb(), { revisionId: revision.id, geometry: packGeometry(revision.model) });
    filled += 1;
  }
}
