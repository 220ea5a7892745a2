// Finding a member or node by the id people read on drawings and in the panels (issue 17 item 8). Pure.
import { ids } from "@/lib/limits";
import type { PreparedModel } from "./prepare";

/** Longest query worth looking up: no model id is longer, so a pasted page of text is refused without a scan. */
export const FIND_MAX_LENGTH = ids.elementIdChars;

/** The member or node with this id (exact first, then ignoring case), with the sphere that frames it. */
export function findById(prepared: PreparedModel, query: string): { kind: "member" | "node"; id: string; centre: [number, number, number]; radius: number } | null {
  const wanted = query.trim();
  if (!wanted || wanted.length > FIND_MAX_LENGTH) return null;
  const lower = wanted.toLowerCase();
  const p = prepared.nodes.positions;
  const memberIndex = prepared.memberIndex.get(wanted) ?? prepared.memberIds.findIndex((id) => id.toLowerCase() === lower);
  if (memberIndex >= 0) {
    const a = prepared.ends[memberIndex * 2] * 3;
    const b = prepared.ends[memberIndex * 2 + 1] * 3;
    const length = Math.hypot(p[b] - p[a], p[b + 1] - p[a + 1], p[b + 2] - p[a + 2]);
    return { kind: "member", id: prepared.memberIds[memberIndex], centre: [(p[a] + p[b]) / 2, (p[a + 1] + p[b + 1]) / 2, (p[a + 2] + p[b + 2]) / 2], radius: length / 2 };
  }
  const nodeIndex = prepared.nodes.index.get(wanted) ?? prepared.nodes.ids.findIndex((id) => id.toLowerCase() === lower);
  if (nodeIndex >= 0) {
    return { kind: "node", id: prepared.nodes.ids[nodeIndex], centre: [p[nodeIndex * 3], p[nodeIndex * 3 + 1], p[nodeIndex * 3 + 2]], radius: 0 };
  }
  return null;
}

