// "Idle for any roof load": whether any load at any loadable node could make a member work, for every member.
//
// The force in member e under a load f is N_e = z_e·f with K z_e = b_e (its influence, the adjoint solve). By
// Maxwell's reciprocity z_e[d] is also N_e under a unit load at dof d, so the influence of every member at every
// loadable dof is the member forces of one solve per loadable dof: K u_d = e_d. A roof has far fewer loadable dofs
// (3 per top node) than members (about 4 per node), so the unit loads are solved (unitLoadForces, batched by their
// nodes' elimination order, which shares most of each forward solve) instead of one adjoint solve per member.
//
// A member is "idle for any roof load" when it is zero-force (design.md: |N| <= 1e-6 × the largest |N| of that
// result, or <= 1e-9 kN) under every unit load: then any roof load, a sum of unit loads, leaves it at zero within
// that tolerance. The loads that make a member work most are the nodes where its influence is largest.
import { classifyMembers } from "@/lib/analysis";
import { SOLVE_BLOCK } from "@/lib/analysis/prepare";
import type { ReviewContext } from "./context";

/** design.md's zero-force rule, applied to each unit-load result. */
export const ANY_LOAD_RELATIVE = 1e-6;
export const ANY_LOAD_ABSOLUTE = 1e-9;

export type LoadAxis = "x" | "y" | "z";
const axes: readonly LoadAxis[] = ["x", "y", "z"];

export type AnyLoadOptions = {
  /** Loadable nodes: the top layer (ends of top-chord members) unless told; every node when there is no top chord. */
  nodes?: string[];
  /** Load directions (all three unless told). */
  directions?: LoadAxis[];
  /** How many of the nodes that matter most to keep per member (3 unless told). */
  keep?: number;
};

/** Where a unit load makes the member work most: kN in the member (tension positive) per 1 kN along +axis. */
export type InfluencePeak = { node: string; direction: LoadAxis; value: number };

export type MemberAnyLoad = {
  member: string;
  /** True when no unit load at any loadable node makes it work (within the stated tolerance). */
  idleForAnyLoad: boolean;
  /** Largest |kN per kN| over the loadable nodes and directions. */
  largestInfluence: number;
  /** The loadable nodes where a load makes it work most, largest first (empty when idle for any load). */
  mattersMost: InfluencePeak[];
};

export type AnyLoadCertificate = {
  loadable: { nodes: number; directions: LoadAxis[]; which: "top layer" | "every node" | "as configured" };
  tolerance: string;
  members: MemberAnyLoad[];
  idleForAnyLoad: string[];
  /** Idle in every analysed result, yet some roof load would make it work: the analysed patterns hide it. */
  idleOnlyForAnalysedLoads: string[];
};

function topLayer(context: ReviewContext): { nodes: string[]; which: AnyLoadCertificate["loadable"]["which"] } {
  const classes = classifyMembers(context.model);
  const top = new Set<string>();
  for (const m of context.model.members) if (classes[m.id] === "top_chord") top.add(m.i).add(m.j);
  if (top.size === 0) return { nodes: context.model.nodes.map((n) => n.id), which: "every node" };
  return { nodes: context.model.nodes.filter((n) => top.has(n.id)).map((n) => n.id), which: "top layer" };
}

/**
 * The certificate for every member. `onProgress` gets the fraction of unit loads solved (for the job's progress).
 */
export function idleForAnyLoad(context: ReviewContext, options: AnyLoadOptions = {}, onProgress?: (fraction: number) => void): AnyLoadCertificate {
  const steps = certify(context, options);
  for (;;) {
    const step = steps.next();
    if (step.done) return step.value;
    onProgress?.(step.value);
  }
}

/**
 * The same certificate, awaiting `onProgress` after each block of unit loads: the whole-roof job writes its progress
 * there, and the event loop gets its turn to send it while the solves run.
 */
export async function idleForAnyLoadAsync(context: ReviewContext, options: AnyLoadOptions, onProgress: (fraction: number) => Promise<void>): Promise<AnyLoadCertificate> {
  const steps = certify(context, options);
  for (;;) {
    const step = steps.next();
    if (step.done) return step.value;
    await onProgress(step.value);
  }
}

/** Solves the unit loads block by block, yielding the fraction done after each block. */
function* certify(context: ReviewContext, options: AnyLoadOptions): Generator<number, AnyLoadCertificate> {
  const { structure, model } = context;
  const { nodeIndex, restrained } = structure.topology;
  const chosen = options.nodes ? { nodes: options.nodes, which: "as configured" as const } : topLayer(context);
  const directions = options.directions ?? [...axes];
  const keep = options.keep ?? 3;
  const m = model.members.length;

  // loadable dofs, in elimination order so that a block's unit loads share their forward solve
  const position = new Int32Array(structure.nodeIds.length);
  structure.eliminationOrder.forEach((node, p) => (position[node] = p));
  const loads: { node: string; k: number; axis: number }[] = [];
  for (const node of chosen.nodes) {
    const k = nodeIndex.get(node);
    if (k === undefined) throw new Error(`no node "${node}"`);
    for (const d of directions) {
      const axis = axes.indexOf(d);
      if (axis < 0) throw new Error(`no direction "${d}"`);
      if (!restrained[3 * k + axis]) loads.push({ node, k, axis }); // a load on a support goes straight into it
    }
  }
  loads.sort((a, b) => position[a.k] - position[b.k] || a.axis - b.axis);

  // Per member: whether any load makes it work, its largest |N|, and its `keep` largest loads (sizes descending,
  // a later load after an equal one), in flat arrays: 28,800 members x 11,163 loads on a 60 x 60 roof.
  const working = new Uint8Array(m);
  const largest = new Float64Array(m);
  const kept = new Int32Array(m);
  const peakSize = new Float64Array(m * keep);
  const peakValue = new Float64Array(m * keep);
  const peakLoad = new Int32Array(m * keep);
  const limit = new Float64Array(SOLVE_BLOCK);
  const loadDofs = Int32Array.from(loads, ({ k, axis }) => 3 * k + axis);
  for (const { first, width, forces } of structure.unitLoadForces(loadDofs)) {
    limit.fill(0, 0, width);
    for (let e = 0; e < m; e++) for (let c = 0; c < width; c++) limit[c] = Math.max(limit[c], Math.abs(forces[e * width + c]));
    for (let c = 0; c < width; c++) limit[c] = Math.max(ANY_LOAD_RELATIVE * limit[c], ANY_LOAD_ABSOLUTE);
    for (let e = 0; e < m; e++) {
      for (let c = 0; c < width; c++) {
        const value = forces[e * width + c];
        const size = Math.abs(value);
        if (size <= limit[c]) continue;
        working[e] = 1;
        if (size > largest[e]) largest[e] = size;
        const base = e * keep;
        const count = kept[e];
        if (count === keep && (keep === 0 || size <= peakSize[base + keep - 1])) continue;
        let at = Math.min(count, keep - 1);
        while (at > 0 && peakSize[base + at - 1] < size) {
          peakSize[base + at] = peakSize[base + at - 1];
          peakValue[base + at] = peakValue[base + at - 1];
          peakLoad[base + at] = peakLoad[base + at - 1];
          at--;
        }
        peakSize[base + at] = size;
        peakValue[base + at] = 0 + value;
        peakLoad[base + at] = first + c;
        if (count < keep) kept[e] = count + 1;
      }
    }
    yield Math.min(1, (first + width) / loads.length);
  }

  const mattersMost = (e: number): InfluencePeak[] =>
    Array.from({ length: kept[e] }, (_, p) => {
      const load = loads[peakLoad[e * keep + p]];
      return { node: load.node, direction: axes[load.axis], value: peakValue[e * keep + p] };
    });

  const zeroEverywhere = new Set(context.result.zeroInAll);
  const members = model.members.map((member, e): MemberAnyLoad => ({
    member: member.id,
    idleForAnyLoad: !working[e],
    largestInfluence: largest[e],
    mattersMost: mattersMost(e),
  }));
  return {
    loadable: { nodes: chosen.nodes.length, directions, which: chosen.which },
    tolerance: `A member is idle for any roof load when a 1 kN load along ${directions.join(", ")} at each loadable node, one at a time, leaves it zero-force: |N| <= ${ANY_LOAD_RELATIVE.toExponential()} × the largest |N| that load causes in any member, or <= ${ANY_LOAD_ABSOLUTE.toExponential()} kN (the zero-force rule of the analysis). Any roof load at these nodes is a sum of such loads. Loads elsewhere (e.g. services hung from the bottom layer) are not covered unless those nodes are made loadable.`,
    members,
    idleForAnyLoad: members.filter((r) => r.idleForAnyLoad).map((r) => r.member),
    idleOnlyForAnalysedLoads: members.filter((r) => !r.idleForAnyLoad && zeroEverywhere.has(r.member)).map((r) => r.member),
  };
}
