// The whole-model review: design checks, verdicts, low-force flags and why-zero explanations per member.
import { DEFAULT_FABRICATION, type AnalysisResult, type TrussModel } from "@/lib/analysis";
import { largestDisplacement, reactionBalance, type ReactionBalance } from "@/lib/analysis/reaction-balance";
import { NOT_CHECKED, STANDING_CAUTION } from "./caution";
import { createReviewContext, type ReviewContext, type ReviewOptions } from "./context";
import { EN_COMPRESSION_SLENDERNESS_LIMIT, EN_TENSION_SLENDERNESS_LIMIT } from "./design-checks/en1993";
import { checkDeflections, DEFAULT_DEFLECTION_LIMIT, type DeflectionCheck } from "./deflection";
import { designMembers, type MemberDesign } from "./member-design";
import { overallStability, type OverallStability } from "./overall-stability";
import type { MemberVerdictKind } from "@/lib/vocabulary/member-verdict";
import { memberVerdicts, type MemberVerdict } from "./verdicts";
import { explainZeroForces, type WhyZero } from "./why-zero";

export type MemberReview = MemberDesign & {
  verdict: { verdict: MemberVerdictKind; reason: string; braces?: string[]; lostRestraints?: MemberVerdict["lostRestraints"]; caution: string };
  /** Results in which the member is low-force (below the threshold yet not zero-force). */
  lowForceIn: string[];
  /** Why the member is zero, per result in which it is zero-force. */
  whyZero: Record<string, Omit<WhyZero, "member">>;
};

export type ModelReview = {
  standard: ReviewOptions["standard"];
  /** Fabrication of sections that state none. */
  fabrication: NonNullable<ReviewOptions["fabrication"]>;
  method: NonNullable<ReviewOptions["method"]>;
  designResults: string[];
  assumptions: string[];
  members: MemberReview[];
  /** Deflection of each serviceability combination against span / limit. */
  deflections: DeflectionCheck[];
  /** Load cases in no combination: analysed and counted for "zero in all", but not in the design envelope. */
  loadCasesInNoCombination: string[];
  /** Critical load factor αcr of the whole truss per design result, its modes, and the warning below 10. */
  overallStability: OverallStability;
  /** Per result: the support reactions' sum against the applied load (ΣR + ΣF = 0 to 1e-9) and the node moving most. */
  reactions: (ReactionBalance & { result: string; largestDisplacement: ReturnType<typeof largestDisplacement> })[];
  summary: { maxUtilisation: number; governingMember: string | null; overCapacity: string[]; verdicts: Record<MemberVerdictKind, number> };
  caution: string;
  /** What no check covers (connections and nodes among them). */
  notChecked: string;
};

function assumptions(options: ReviewOptions, model: TrussModel): string[] {
  const list = [
    model.combinations.length > 0
      ? `Every ultimate combination is checked for resistance (the largest utilisation governs); serviceability combinations only for deflection, against span/${options.deflectionLimit ?? DEFAULT_DEFLECTION_LIMIT} (default span/${DEFAULT_DEFLECTION_LIMIT}, common practice).`
      : "The model has no combinations: load cases are checked unfactored.",
    "Axial checks only (pin-jointed truss): tension yielding of the gross section (and rupture of the net section where there is a hole or opening; AISC also on Ae = Ag, U = 1) and flexural buckling. Connections and joints (nodes) are not checked.",
    `fu per material from the model, else the usual value of its grade (product standards), else 1.10·fy; fabrication per section, ${options.fabrication ?? DEFAULT_FABRICATION} where a section states none (the conservative default).`,
    "Buckling length = effective length factor × member length (factor 1.0 unless the member gives one).",
    "E and fy are the model material's values; area and radius of gyration the model section's.",
    "Overall stability: the critical load factor αcr of the whole truss per design result (linear buckling, first-order member forces); below 10 second-order effects must be considered (EN 1993-1-1 5.2.1(3)). Connections and joint (node) stiffness are not modelled: joints are pins.",
    "Bracing is judged by stability: a joint of a compression member counts as held when its lateral stiffness across the member, from the (reduced) structure, is at least 4P/L (Winter's ideal brace stiffness 2P/L doubled); a member that loses that hold at a joint is re-checked with its buckling length doubled.",
  ];
  if (options.standard === "EN1993-1-1") {
    list.push(
      "Buckling curve per section from Table 6.2: hot finished a (a0 for S460), cold formed c; γM0 = γM1 = 1.0, γM2 = 1.25 (recommended values).",
      `Slenderness warnings at λ > ${EN_COMPRESSION_SLENDERNESS_LIMIT} (compression) and > ${EN_TENSION_SLENDERNESS_LIMIT} (tension): common practice, not an EN 1993-1-1 rule.`,
    );
  } else {
    list.push(
      options.method === "ASD"
        ? "ASD: Ωt = 1.67 (D2 yielding), 2.00 (D2 rupture), Ωc = 1.67 (E3); the combinations must be ASD ones; slenderness warnings at the D1/E2 user-note limits 300 and 200."
        : "LRFD: φt = 0.90 (D2 yielding), 0.75 (D2 rupture), φc = 0.90 (E3); slenderness warnings at the D1/E2 user-note limits 300 and 200.",
      "ERW (cold-formed) tubes use the design wall thickness 0.93·t (B4.2).",
    );
  }
  return list;
}

/** Reviews every member of an analysed, stable model. Plain JSON-serialisable data out. */
export function reviewModel(model: TrussModel, result: AnalysisResult, options: ReviewOptions, context: ReviewContext = createReviewContext(model, result, options)): ModelReview {
  const designs = designMembers(model, result, options);
  const verdicts = memberVerdicts(context);
  const why = explainZeroForces(model, result, context.structure.topology);
  const whyByMember = new Map<string, Record<string, Omit<WhyZero, "member">>>();
  for (const [resultId, list] of Object.entries(why)) {
    for (const { member, ...rest } of list) {
      const entry = whyByMember.get(member) ?? {};
      entry[resultId] = rest;
      whyByMember.set(member, entry);
    }
  }
  const threshold = options.lowForceThreshold;
  const zeroSets = Object.fromEntries(Object.entries(result.results).map(([id, r]) => [id, new Set(r.zeroForceMembers)]));
  const members = designs.map((design, e): MemberReview => {
    const id = design.member;
    const lowForceIn =
      threshold === undefined
        ? []
        : Object.entries(result.results)
            .filter(([rid, r]) => !zeroSets[rid].has(id) && Math.abs(r.memberForces[id]) <= threshold)
            .map(([rid]) => rid);
    const { verdict: kind, reason, braces, lostRestraints, caution } = verdicts[e];
    const verdict = braces ? { verdict: kind, reason, braces, lostRestraints, caution } : { verdict: kind, reason, caution };
    return { ...design, verdict, lowForceIn, whyZero: whyByMember.get(id) ?? {} };
  });

  let maxUtilisation = 0;
  let governingMember: string | null = null;
  const counts: Record<MemberVerdictKind, number> = { "load-bearing": 0, stabilising: 0, bracing: 0, idle: 0 };
  for (const m of members) {
    counts[m.verdict.verdict]++;
    if (m.governing && m.governing.utilisation > maxUtilisation) {
      maxUtilisation = m.governing.utilisation;
      governingMember = m.member;
    }
  }
  return {
    standard: options.standard,
    fabrication: options.fabrication ?? DEFAULT_FABRICATION,
    method: options.method ?? "LRFD",
    designResults: context.designResults,
    assumptions: assumptions(options, model),
    members,
    deflections: checkDeflections(model, result, options.deflectionLimit ?? DEFAULT_DEFLECTION_LIMIT),
    loadCasesInNoCombination: result.info.loadCasesInNoCombination,
    overallStability: overallStability(context),
    reactions: Object.entries(result.results).map(([id, r]) => ({ result: id, ...reactionBalance(model, id, r), largestDisplacement: largestDisplacement(r) })),
    summary: {
      maxUtilisation,
      governingMember,
      overCapacity: members.filter((m) => (m.governing?.utilisation ?? 0) > 1).map((m) => m.member),
      verdicts: counts,
    },
    caution: STANDING_CAUTION,
    notChecked: NOT_CHECKED,
  };
}
