// Influence map of one member: its force per unit downward load at each top-layer node, from one adjoint solve.
//
// N_e = b_e·u and K u = f, so N_e = b_e·K⁻¹f = z·f with K z = b_e (K symmetric). A 1 kN load in −z at node k
// gives N_e = −z[3k+2]: one solve answers every node at once.
import { classifyMembers } from "@/lib/analysis";
import type { ReviewContext } from "./context";

export type InfluenceMap = {
  member: string;
  /** kN in the member (tension positive) per 1 kN acting downward at the node. */
  values: { node: string; value: number }[];
  largestTension: { node: string; value: number } | null;
  largestCompression: { node: string; value: number } | null;
};

/** Nodes of the top layer (ends of top-chord members); every node when the model has no top chord. */
export function topLayerNodes(context: ReviewContext): string[] {
  const classes = classifyMembers(context.model);
  const nodes = new Set<string>();
  for (const m of context.model.members) if (classes[m.id] === "top_chord") nodes.add(m.i).add(m.j);
  return nodes.size > 0 ? context.model.nodes.filter((n) => nodes.has(n.id)).map((n) => n.id) : context.model.nodes.map((n) => n.id);
}

/** One member's force per unit downward load at each of the given nodes (top layer unless told). */
export function influenceMap(context: ReviewContext, memberId: string, nodes: string[] = topLayerNodes(context)): InfluenceMap {
  const e = context.memberIndex.get(memberId);
  if (e === undefined) throw new Error(`no member "${memberId}"`);
  const z = context.structure.solve(context.structure.memberForceVector(e));
  const { nodeIndex } = context.structure.topology;
  const values = nodes.map((node) => {
    const k = nodeIndex.get(node);
    if (k === undefined) throw new Error(`no node "${node}"`);
    return { node, value: 0 - z[3 * k + 2] }; // 0 − z keeps a held node at +0
  });
  let tension: InfluenceMap["largestTension"] = null;
  let compression: InfluenceMap["largestCompression"] = null;
  for (const v of values) {
    if (v.value > 0 && (!tension || v.value > tension.value)) tension = v;
    if (v.value < 0 && (!compression || v.value < compression.value)) compression = v;
  }
  return { member: memberId, values, largestTension: tension, largestCompression: compression };
}
