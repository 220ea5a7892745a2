// What each member is, for removal: load-bearing, stabilising, bracing or idle (glossary.md), over all results.
import { STANDING_CAUTION } from "./caution";
import type { ReviewContext } from "./context";
import { lowRankRemoval } from "./low-rank";
import { fullyRestrained } from "./removal";
import { holdingRank } from "./span";

export type VerdictKind = "load-bearing" | "stabilising" | "bracing" | "idle";

export type MemberVerdict = {
  member: string;
  verdict: VerdictKind;
  reason: string;
  /** Compression members whose end joint this member holds (bracing verdicts only). */
  braces?: string[];
  caution: string;
};

/**
 * Classifies every member. Load-bearing: force in some load case or combination. Of the rest (zero in every
 * result), stabilising: the structure becomes a mechanism without it (one low-rank check per member);
 * bracing: it frames, not in line, into a joint (not fully restrained) of a member that is in compression in
 * some result, so it shortens that member's buckling length; idle: none of these.
 */
export function memberVerdicts(context: ReviewContext): MemberVerdict[] {
  const { model, result, structure, forces } = context;
  const { adjStart, adjMember, direction, memberI, memberJ, restrained } = structure.topology;
  const resultIds = Object.keys(result.results);
  const zeroSets = resultIds.map((id) => new Set(result.results[id].zeroForceMembers));
  const zeroEverywhere = model.members.map((m) => zeroSets.every((set) => set.has(m.id)));
  const inCompression = model.members.map((m, e) => resultIds.some((id, k) => !zeroSets[k].has(m.id) && forces.get(id)![e] < 0));

  return model.members.map((member, e): MemberVerdict => {
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
    // A joint left with fewer than three independent holding directions is a mechanism outright; otherwise
    // one low-rank solve decides.
    const locallyFree = holdingRank(structure.topology, memberI[e], e) < 3 || holdingRank(structure.topology, memberJ[e], e) < 3;
    if (locallyFree || lowRankRemoval(structure, [e]).mechanism) {
      return { member: member.id, verdict: "stabilising", reason: "Zero in every load case and combination, but the roof becomes a mechanism without it.", caution: STANDING_CAUTION };
    }
    const braces = new Set<string>();
    for (const a of [memberI[e], memberJ[e]]) {
      if (fullyRestrained(restrained, a)) continue;
      for (let p = adjStart[a]; p < adjStart[a + 1]; p++) {
        const m = adjMember[p];
        if (m === e || !inCompression[m]) continue;
        const cos = direction[3 * m] * direction[3 * e] + direction[3 * m + 1] * direction[3 * e + 1] + direction[3 * m + 2] * direction[3 * e + 2];
        if (Math.abs(cos) <= 1 - 1e-9) braces.add(model.members[m].id);
      }
    }
    if (braces.size > 0) {
      return {
        member: member.id,
        verdict: "bracing",
        reason: `Zero in every load case and combination, but it holds a joint of ${[...braces].join(", ")}, in compression; without it their buckling length is taken as doubled.`,
        braces: [...braces],
        caution: STANDING_CAUTION,
      };
    }
    return {
      member: member.id,
      verdict: "idle",
      reason: "Zero in every load case and combination, not needed for stability and bracing no compression member: a candidate for the engineer's review.",
      caution: STANDING_CAUTION,
    };
  });
}
