// What each member is, for removal: load-bearing, stabilising, bracing or idle (glossary.md), over all results.
import { describeDirection } from "@/lib/analysis/mechanism";
import { SOLVE_BLOCK } from "@/lib/analysis/prepare";
import type { MemberVerdictKind } from "@/lib/vocabulary/member-verdict";
import { STANDING_CAUTION } from "./caution";
import type { ReviewContext } from "./context";
import { MECHANISM_TOLERANCE } from "./low-rank";
import { fullyRestrained } from "./removal";
import { BRACE_STIFFNESS_FACTOR, flexibilityBlock, weakestAcross } from "./restraint";
import { holdingRank } from "./span";

/** A joint of a compression member that would no longer be held across it without this member. */
export type LostRestraint = {
  joint: string;
  member: string;
  /** Unit direction (x, y, z) in which the joint loses its hold. */
  direction: [number, number, number];
  /** Lateral stiffness of the joint across the member (kN/m) with and without this member, and what a brace needs. */
  stiffnessBefore: number;
  stiffnessAfter: number;
  required: number;
};

export type MemberVerdict = {
  member: string;
  verdict: MemberVerdictKind;
  reason: string;
  /** Compression members whose end joint only this member holds (bracing verdicts only). */
  braces?: string[];
  lostRestraints?: LostRestraint[];
  caution: string;
};

/**
 * Classifies every member. Load-bearing: force in some load case or combination. Of the rest (zero in every
 * result), stabilising: the structure becomes a mechanism without it (Sherman–Morrison pivot M_e = 1 − g_eᵀK⁻¹g_e);
 * bracing: without it a joint of a compression member is no longer held across that member, judged by stability:
 * the joint's lateral stiffness from the reduced structure, F' = F + z zᵀ / M_e (z = K⁻¹g_e at the joint), falls
 * below the 4P/L a brace needs (restraint.ts) while the intact structure met it; idle: none of these.
 * All solves run in blocks through one factor; `onProgress` gets the fraction done.
 */
export function memberVerdicts(context: ReviewContext, onProgress?: (fraction: number) => void): MemberVerdict[] {
  const { model, result, structure, forces } = context;
  const topology = structure.topology;
  const { adjStart, adjMember, direction, memberI, memberJ, restrained, axialStiffness, nodeIds } = topology;
  const m = model.members.length;
  const dofs = 3 * nodeIds.length;
  const resultIds = Object.keys(result.results);
  const zeroSets = resultIds.map((id) => new Set(result.results[id].zeroForceMembers));
  const zeroEverywhere = model.members.map((mem) => zeroSets.every((set) => set.has(mem.id)));
  // largest compression each member sees in any result (kN, positive)
  const compression = new Float64Array(m);
  model.members.forEach((mem, e) =>
    resultIds.forEach((id, k) => {
      if (!zeroSets[k].has(mem.id)) compression[e] = Math.max(compression[e], -forces.get(id)![e]);
    }),
  );
  const lengths = context.inputs.map((i) => i.length);

  // candidates: zero everywhere and each end joint still spans three directions without it
  const candidates: number[] = [];
  const locallyFree = new Uint8Array(m);
  for (let e = 0; e < m; e++) {
    if (!zeroEverywhere[e]) continue;
    if (holdingRank(topology, memberI[e], e) < 3 || holdingRank(topology, memberJ[e], e) < 3) locallyFree[e] = 1;
    else candidates.push(e);
  }

  // M_e and z_e at the two end joints, one solver block of candidates per pass (the workspace holds SOLVE_BLOCK vectors)
  const pivot = new Float64Array(m).fill(1);
  const zEnds = new Map<number, Float64Array>(); // 6 values: z at joint i, then at joint j
  const columns = new Float64Array(dofs * SOLVE_BLOCK);
  const total = candidates.length * 2 + 1;
  let done = 0;
  for (let first = 0; first < candidates.length; first += SOLVE_BLOCK) {
    const chunk = candidates.slice(first, first + SOLVE_BLOCK);
    columns.fill(0);
    chunk.forEach((e, c) => {
      const scale = Math.sqrt(axialStiffness[e]);
      for (let s = 0; s < 3; s++) {
        columns[c * dofs + 3 * memberI[e] + s] = -scale * direction[3 * e + s];
        columns[c * dofs + 3 * memberJ[e] + s] = scale * direction[3 * e + s];
      }
    });
    const z = structure.solveColumns(columns.subarray(0, chunk.length * dofs), chunk.length);
    chunk.forEach((e, c) => {
      let gz = 0;
      for (let s = 0; s < 3; s++) {
        gz += columns[c * dofs + 3 * memberI[e] + s] * z[c * dofs + 3 * memberI[e] + s] + columns[c * dofs + 3 * memberJ[e] + s] * z[c * dofs + 3 * memberJ[e] + s];
      }
      pivot[e] = 1 - gz;
      const ends = new Float64Array(6);
      for (let s = 0; s < 3; s++) {
        ends[s] = z[c * dofs + 3 * memberI[e] + s];
        ends[3 + s] = z[c * dofs + 3 * memberJ[e] + s];
      }
      zEnds.set(e, ends);
    });
    done += chunk.length;
    onProgress?.(done / total);
  }

  // joints whose lateral restraint must be judged: ends (not fully held) of non-stabilising candidates that
  // frame into a compression member not in line with the candidate
  const bracedAt = (e: number, a: number) => {
    const list: number[] = [];
    if (fullyRestrained(restrained, a)) return list;
    for (let p = adjStart[a]; p < adjStart[a + 1]; p++) {
      const q = adjMember[p];
      if (q === e || compression[q] <= 0) continue;
      const cos = direction[3 * q] * direction[3 * e] + direction[3 * q + 1] * direction[3 * e + 1] + direction[3 * q + 2] * direction[3 * e + 2];
      if (Math.abs(cos) <= 1 - 1e-9) list.push(q);
    }
    return list;
  };
  const joints = new Set<number>();
  for (const e of candidates) {
    if (pivot[e] < MECHANISM_TOLERANCE) continue;
    for (const a of [memberI[e], memberJ[e]]) if (bracedAt(e, a).length > 0) joints.add(a);
  }
  const flexibility = new Map<number, Float64Array>();
  const jointList = [...joints];
  const perPass = Math.floor(SOLVE_BLOCK / 3);
  for (let first = 0; first < jointList.length; first += perPass) {
    const chunk = jointList.slice(first, first + perPass);
    columns.fill(0);
    chunk.forEach((a, c) => {
      for (let s = 0; s < 3; s++) columns[(3 * c + s) * dofs + 3 * a + s] = 1;
    });
    const u = structure.solveColumns(columns.subarray(0, 3 * chunk.length * dofs), 3 * chunk.length);
    chunk.forEach((a, c) => {
      const cols = [0, 1, 2].map((s) => u.subarray((3 * c + s) * dofs, (3 * c + s + 1) * dofs));
      flexibility.set(a, flexibilityBlock(cols, a));
    });
    onProgress?.((done + (first + chunk.length) / Math.max(1, jointList.length) * candidates.length) / total);
  }

  const verdicts = model.members.map((member, e): MemberVerdict => {
    if (!zeroEverywhere[e]) {
      let worst = 0;
      let where = "";
      resultIds.forEach((id) => {
        const n = forces.get(id)![e];
        if (Math.abs(n) > Math.abs(worst)) {
          worst = n;
          where = id;
        }
      });
      const sense = worst > 0 ? "tension" : "compression";
      return { member: member.id, verdict: "load-bearing", reason: `Carries force: up to ${Math.abs(worst).toPrecision(4)} kN ${sense} in ${where}.`, caution: STANDING_CAUTION };
    }
    if (locallyFree[e] || pivot[e] < MECHANISM_TOLERANCE) {
      return { member: member.id, verdict: "stabilising", reason: "Zero in every load case and combination, but the roof becomes a mechanism without it.", caution: STANDING_CAUTION };
    }
    const lost: LostRestraint[] = [];
    const ends = zEnds.get(e)!;
    [memberI[e], memberJ[e]].forEach((a, side) => {
      const F = flexibility.get(a);
      if (!F) return;
      const reduced = new Float64Array(9);
      for (let s = 0; s < 3; s++) for (let t = 0; t < 3; t++) reduced[3 * s + t] = F[3 * s + t] + (ends[3 * side + s] * ends[3 * side + t]) / pivot[e];
      for (const q of bracedAt(e, a)) {
        const c = direction.subarray(3 * q, 3 * q + 3);
        const required = (BRACE_STIFFNESS_FACTOR * compression[q]) / lengths[q];
        const before = weakestAcross(F, c);
        const after = weakestAcross(reduced, c);
        if (before.stiffness >= required && after.stiffness < required) {
          lost.push({ joint: nodeIds[a], member: model.members[q].id, direction: after.direction, stiffnessBefore: before.stiffness, stiffnessAfter: after.stiffness, required });
        }
      }
    });
    if (lost.length > 0) {
      const braces = [...new Set(lost.map((l) => l.member))];
      const where = lost.map((l) => `${l.joint} across ${l.member}, along ${describeDirection(l.direction)} (${l.stiffnessAfter.toPrecision(3)} kN/m left, ${l.required.toPrecision(3)} needed)`).join("; ");
      return {
        member: member.id,
        verdict: "bracing",
        reason: `Zero in every load case and combination, but without it these joints are no longer held across compression members: ${where}.`,
        braces,
        lostRestraints: lost,
        caution: STANDING_CAUTION,
      };
    }
    return {
      member: member.id,
      verdict: "idle",
      reason: "Zero in every load case and combination, not needed for stability, and every joint it touches stays held across its compression members without it: a candidate for the engineer's review.",
      caution: STANDING_CAUTION,
    };
  });
  onProgress?.(1);
  return verdicts;
}
