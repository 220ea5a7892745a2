// Why is a member zero-force? Joint inspection with the textbook zero-force rules, applied repeatedly.
//
// Rules (check-values §5.1): planar rule 1 (two non-collinear members at an unloaded, unsupported joint),
// planar rule 2 (three members, two collinear), the special case (load along one of two members) and the
// space-truss form (all members but one in one plane, no load or reaction out of it; Hibbeler, Statics §6.5,
// from memory). All are one statement: at a joint, ΣF·n = 0 along any direction n normal to the other members,
// the load and the restrained directions; if member m has a component along such an n, N_m = 0. Once a member
// is shown zero it drops out at both its joints and the inspection is repeated there (Baker & Haynes §6.3).
import { loadVectorForCase, type AnalysisResult, type TrussModel } from "@/lib/analysis";
import { buildTopology, type Topology } from "@/lib/analysis/topology";
import { AXES, Span } from "./span";

/** A member must leave the plane by more than this (sine of the angle) before inspection calls it zero. */
const OUT_OF_PLANE_TOLERANCE = 1e-4;

export type ZeroRule = "planar rule 1" | "planar rule 2" | "special case: load along the other member" | "space-truss rule" | "last member at the joint";

/** One inspection step: at `joint`, `member` is shown zero once `after` have dropped out there. */
export type InspectionStep = { member: string; joint: string; rule: ZeroRule; after: string[]; text: string };

export type WhyZero =
  | { member: string; method: "inspection"; explanation: string; chain: InspectionStep[] }
  | { member: string; method: "analysis"; explanation: string; chain: [] };


/**
 * Runs joint inspection for one load vector (full 3n, kN). Returns, by member index, the step that shows it zero.
 * Member indices follow the topology.
 */
export function inspectZeroForces(topology: Topology, load: Float64Array): Map<number, InspectionStep> {
  const { nodeIds, memberIds, direction, adjStart, adjMember, restrained } = topology;
  const n = nodeIds.length;
  const found = new Map<number, InspectionStep>();
  const droppedAt: string[][] = Array.from({ length: n }, () => []);
  const queue: number[] = [];
  const queued = new Uint8Array(n);
  for (let a = 0; a < n; a++) {
    queue.push(a);
    queued[a] = 1;
  }
  for (let head = 0; head < queue.length; head++) {
    const a = queue[head];
    queued[a] = 0;
    const step = inspectJoint(a);
    if (!step) continue;
    found.set(step.index, step.step);
    for (const end of [topology.memberI[step.index], topology.memberJ[step.index]]) {
      droppedAt[end].push(memberIds[step.index]);
      if (!queued[end]) {
        queue.push(end);
        queued[end] = 1;
      }
    }
  }
  return found;

  function inspectJoint(a: number): { index: number; step: InspectionStep } | null {
    const active: number[] = [];
    for (let p = adjStart[a]; p < adjStart[a + 1]; p++) if (!found.has(adjMember[p])) active.push(adjMember[p]);
    const P = [load[3 * a], load[3 * a + 1], load[3 * a + 2]];
    const loaded = P[0] !== 0 || P[1] !== 0 || P[2] !== 0;
    // A restraint normal to every member at the joint (the out-of-plane hold of a planar truss) takes no part
    // in the joint's in-plane balance, so it does not make the joint "supported" for naming the rule.
    const memberSpan = new Span();
    for (const o of active) memberSpan.add(direction.subarray(3 * o, 3 * o + 3));
    const supported = [0, 1, 2].some((s) => restrained[3 * a + s] && Math.hypot(...memberSpan.residual(AXES[s])) < 1 - OUT_OF_PLANE_TOLERANCE);
    for (const m of active) {
      const span = new Span();
      const others = active.filter((o) => o !== m);
      for (const o of others) span.add(direction.subarray(3 * o, 3 * o + 3));
      const otherRank = span.basis.length;
      if (loaded) span.add(P);
      const loadInLine = span.basis.length === otherRank;
      for (let s = 0; s < 3; s++) if (restrained[3 * a + s]) span.add(AXES[s]);
      const r = span.residual(direction.subarray(3 * m, 3 * m + 3));
      if (Math.hypot(r[0], r[1], r[2]) <= OUT_OF_PLANE_TOLERANCE) continue;
      const rule = nameRule(others.length, otherRank, loaded && loadInLine, loaded, supported);
      return { index: m, step: { member: memberIds[m], joint: nodeIds[a], rule, after: [...droppedAt[a]], text: describe(memberIds[m], nodeIds[a], others.map((o) => memberIds[o]), rule, loaded, supported, droppedAt[a]) } };
    }
    return null;
  }
}

function nameRule(otherCount: number, otherRank: number, loadAlongOthers: boolean, loaded: boolean, supported: boolean): ZeroRule {
  const free = !loaded && !supported;
  if (free && otherCount === 0) return "last member at the joint";
  if (free && otherCount === 1) return "planar rule 1";
  if (free && otherCount === 2 && otherRank === 1) return "planar rule 2";
  if (loadAlongOthers && !supported && otherCount === 1) return "special case: load along the other member";
  return "space-truss rule";
}

function describe(member: string, joint: string, others: string[], rule: ZeroRule, loaded: boolean, supported: boolean, dropped: string[]) {
  const state = loaded || supported ? `${[loaded && "loaded", supported && "supported"].filter(Boolean).join(" and ")}` : "unloaded and unsupported";
  const before = dropped.length > 0 ? ` once ${dropped.join(", ")} ${dropped.length > 1 ? "are" : "is"} known to carry nothing` : "";
  const list = others.join(", ");
  switch (rule) {
    case "last member at the joint":
      return `At joint ${joint} (${state})${before}, ${member} is the only member left, so nothing balances it: ${member} carries nothing.`;
    case "planar rule 1":
      return `At joint ${joint} (${state})${before}, only ${member} and ${list} remain and they are not collinear: both carry nothing (two-member rule).`;
    case "planar rule 2":
      return `At joint ${joint} (${state})${before}, ${list} are collinear and ${member} is not: ${member} carries nothing (three-member rule).`;
    case "special case: load along the other member":
      return `At joint ${joint} (${state})${before}, the load acts along ${list}, the only other member: ${member} carries nothing.`;
    case "space-truss rule":
      return `At joint ${joint} (${state})${before}, ${list || "no other member"}${loaded ? ", the load" : ""}${supported ? " and the support reactions" : ""} lie in one plane (or line) and ${member} leaves it: ${member} carries nothing (force balance normal to that plane).`;
  }
}

/** Every inspection step a member's zero depends on, in the order they were found. */
function chainFor(memberIndex: number, steps: Map<number, InspectionStep>, indexOf: Map<string, number>): InspectionStep[] {
  const chain = new Map<number, InspectionStep>();
  const visit = (e: number) => {
    if (chain.has(e)) return;
    const step = steps.get(e)!;
    for (const id of step.after) visit(indexOf.get(id)!);
    chain.set(e, step);
  };
  visit(memberIndex);
  return [...chain.values()];
}

/** The load vector (full 3n, kN) of a load case or combination. */
export function loadVectorForResult(model: TrussModel, resultId: string, topology: Topology): Float64Array {
  const combination = model.combinations.find((c) => c.id === resultId);
  if (!combination) return loadVectorForCase(model, resultId, topology);
  const f = new Float64Array(3 * topology.nodeIds.length);
  for (const [caseId, factor] of Object.entries(combination.factors)) {
    const v = loadVectorForCase(model, caseId, topology);
    for (let q = 0; q < f.length; q++) f[q] += factor * v[q];
  }
  return f;
}

/** Explains every zero-force member of every result (load case and combination): by inspection where it can. */
export function explainZeroForces(model: TrussModel, result: AnalysisResult, topology: Topology = buildTopology(model)): Record<string, WhyZero[]> {
  const indexOf = new Map(topology.memberIds.map((id, e) => [id, e]));
  const out: Record<string, WhyZero[]> = {};
  for (const [resultId, caseResult] of Object.entries(result.results)) {
    if (caseResult.zeroForceMembers.length === 0) {
      out[resultId] = [];
      continue;
    }
    const steps = inspectZeroForces(topology, loadVectorForResult(model, resultId, topology));
    out[resultId] = caseResult.zeroForceMembers.map((member): WhyZero => {
      const e = indexOf.get(member)!;
      if (!steps.has(e)) {
        return { member, method: "analysis", explanation: "Zero by analysis: no joint rule shows it; the forces around it balance without it in this result.", chain: [] };
      }
      const chain = chainFor(e, steps, indexOf);
      return { member, method: "inspection", explanation: chain.map((s) => s.text).join(" Then: "), chain };
    });
  }
  return out;
}
