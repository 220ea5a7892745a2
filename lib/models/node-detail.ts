// One node's results as the node and member panels read them (GET …/models/N/nodes/<id>, and a member's two end
// nodes in its own detail): displacement ux, uy, uz and its length |u| in every result, and the support reaction
// where the node is supported. Pure: presents what db/queries/node-detail.ts read.
import { STANDING_CAUTION } from "@/lib/review/caution";

/** A node's numbers in one result: displacement in m, reaction in kN (null where the node is not supported). */
export type NodeResult = {
  displacement: { ux: number; uy: number; uz: number; total: number };
  reaction: { fx: number; fy: number; fz: number } | null;
};

export type NodeDetail = {
  node: { id: string; x: number; y: number; z: number };
  /** Restrained translations (true = held); null when the node is free. */
  support: { ux: boolean; uy: boolean; uz: boolean } | null;
  results: Record<string, NodeResult>;
  caution: string;
};

type StoredRow = { resultId: string; nodeId: string; displacement: { ux: number; uy: number; uz: number } | null; reaction: { fx: number; fy: number; fz: number } | null };

/** Per result, per node: the stored rows keyed for the panels (a node the analysis did not move reads as zero). */
export function nodeResultsFrom(rows: StoredRow[]): Record<string, Record<string, NodeResult>> {
  const byResult: Record<string, Record<string, NodeResult>> = {};
  for (const row of rows) {
    const { ux, uy, uz } = row.displacement ?? { ux: 0, uy: 0, uz: 0 };
    (byResult[row.resultId] ??= {})[row.nodeId] = {
      displacement: { ux, uy, uz, total: Math.hypot(ux, uy, uz) },
      reaction: row.reaction ? { fx: row.reaction.fx, fy: row.reaction.fy, fz: row.reaction.fz } : null,
    };
  }
  return byResult;
}

type Stored = {
  node: { id: string; x: number; y: number; z: number };
  support: { ux: boolean; uy: boolean; uz: boolean } | null;
  results: StoredRow[];
};

/** The answer for the node panel from what getNodeDetail read. */
export function presentNodeDetail(stored: Stored): NodeDetail {
  const { id, x, y, z } = stored.node;
  const perResult = nodeResultsFrom(stored.results);
  return {
    node: { id, x, y, z },
    support: stored.support ? { ux: stored.support.ux, uy: stored.support.uy, uz: stored.support.uz } : null,
    results: Object.fromEntries(Object.entries(perResult).map(([resultId, nodes]) => [resultId, nodes[id]])),
    caution: STANDING_CAUTION,
  };
}
