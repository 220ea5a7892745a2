import "server-only";
import { insertRevisionWithAnalysis, withNextRevision, type CreateRevisionInput } from "@/db/queries/models";
import { encodeResultColumns } from "@/lib/models/result-columns";
import { packGeometry } from "@/lib/models/geometry-wire";

/**
 * Stores a new revision with an analysis already computed (JSON and columns), in one transaction: for tests and
 * benchmarks that bring their own analysis instead of queueing a job.
 */
export function createRevisionWithAnalysis(input: Omit<CreateRevisionInput, "columns" | "geometry">): Promise<{ id: string; number: number }> {
  const columns = encodeResultColumns(input.model, input.result, input.review);
  return withNextRevision((tx) => insertRevisionWithAnalysis(tx, { ...input, geometry: packGeometry(input.model), columns }));
}
