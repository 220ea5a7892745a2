// The analysis and member review stored with a new revision, run at save time so the viewer never waits for a
// solve. The review keeps per member: verdict (load-bearing / stabilising / bracing / idle) and the governing
// design check with its arithmetic; what-ifs and why-zero explanations are computed on demand in the browser.
import { analyzeModel, type AnalysisResult, type TrussModel } from "@/lib/analysis";
import { wholeRoofCheckMembers } from "@/lib/limits";
import { STANDING_CAUTION } from "@/lib/review/caution";
import { createReviewContext } from "@/lib/review/context";
import type { AnalysedPattern } from "@/lib/review/analysed-patterns";
import { idleForAnyLoad, type AnyLoadCertificate, type InfluencePeak } from "@/lib/review/any-load";
import { checkDeflections, DEFAULT_DEFLECTION_LIMIT, type DeflectionCheck } from "@/lib/review/deflection";
import { overallStability, type OverallStability } from "@/lib/review/overall-stability";
import type { DesignStandard } from "@/lib/review/design-checks/types";
import { designMembers, type MemberDesign } from "@/lib/review/member-design";
import { memberVerdicts } from "@/lib/review/verdicts";
import type { MemberVerdictKind } from "@/lib/vocabulary/member-verdict";

export type StoredMemberReview = {
  verdict: MemberVerdictKind;
  reason: string;
  braces?: string[];
  /** Largest utilisation over the design results; null when the member never carries force. */
  utilisation: number | null;
  governing: MemberDesign["governing"];
  checks: MemberDesign["checks"];
  warnings: string[];
  /** Whether any load at a loadable node could make it work, and where most (absent on older reviews). */
  anyLoad?: { idle: boolean; mattersMost: InfluencePeak[] };
};

/**
 * Overall stability per design result as stored: the lowest factors with up to 12 moving joints each, and the
 * first mode's shape (3 per model node, 4 significant digits) for the viewer to draw.
 */
export type StoredStability = Omit<OverallStability, "results"> & {
  results: {
    result: string;
    alphaCr: number | null;
    converged: boolean;
    warning: string | null;
    modes: { alphaCr: number; joints: OverallStability["results"][number]["modes"][number]["joints"] }[];
    shape: number[] | null;
  }[];
};

/**
 * The "idle for any roof load" run, without the per-member rows (those are on each member). `patterns` only on
 * reviews stored before the review kept them itself (`analysedPatterns`).
 */
export type StoredAnyLoad = Omit<AnyLoadCertificate, "members"> & { patterns?: AnalysedPattern[] };

/**
 * `stability` and `anyLoad` are absent on reviews stored before those checks existed, and on roofs too large for them
 * (then `wholeRoofChecksLeftOut` says why).
 */
export type StoredReview = {
  standard: DesignStandard;
  caution: string;
  /** Every load case analysed, kept at every roof size (absent on reviews stored before: lib/review/analysed-patterns.ts). */
  analysedPatterns?: AnalysedPattern[];
  members: Record<string, StoredMemberReview>;
  /** Each serviceability combination's largest vertical deflection against span/deflectionLimit (absent on reviews stored before). */
  deflections?: DeflectionCheck[];
  /** The N of span/N the review used: the project's setting when it was analysed (absent on reviews stored before; they used 250). */
  deflectionLimit?: number;
  stability?: StoredStability;
  anyLoad?: StoredAnyLoad;
  wholeRoofChecksLeftOut?: string;
};

function storedStability(stability: OverallStability): StoredStability {
  return {
    ...stability,
    results: stability.results.map((r) => ({
      result: r.result,
      alphaCr: r.alphaCr,
      converged: r.converged,
      warning: r.warning,
      modes: r.modes.map((m) => ({ alphaCr: m.alphaCr, joints: m.joints.slice(0, 12) })),
      shape: r.modes[0]?.shape?.map((x) => Number(x.toPrecision(4))) ?? null,
    })),
  };
}

/** The certificate as stored: its summary on the review, and each member's row on that member (keyed by id). */
export function storedAnyLoad(model: TrussModel, certificate: AnyLoadCertificate): { anyLoad: StoredAnyLoad; members: Record<string, NonNullable<StoredMemberReview["anyLoad"]>> } {
  const { loadable, tolerance, idleForAnyLoad: idle, idleOnlyForAnalysedLoads } = certificate;
  const members: Record<string, NonNullable<StoredMemberReview["anyLoad"]>> = {};
  model.members.forEach((member, e) => (members[member.id] = { idle: certificate.members[e].idleForAnyLoad, mattersMost: certificate.members[e].mattersMost }));
  return { anyLoad: { loadable, tolerance, idleForAnyLoad: idle, idleOnlyForAnalysedLoads }, members };
}

/** Analyses a validated model and, when it is stable, reviews every member against the design standard. */
export function analyseForStorage(model: TrussModel, standard: DesignStandard, deflectionLimit = DEFAULT_DEFLECTION_LIMIT): { result: AnalysisResult; review: StoredReview | null } {
  const result = analyzeModel(model);
  return { result, review: reviewForStorage(model, result, standard, deflectionLimit) };
}

/** The member review of an analysed model, deflections against span/deflectionLimit; null when the model is unstable. */
export function reviewForStorage(model: TrussModel, result: AnalysisResult, standard: DesignStandard, deflectionLimit = DEFAULT_DEFLECTION_LIMIT): StoredReview | null {
  if (result.status !== "ok") return null;
  const context = createReviewContext(model, result, { standard });
  const verdicts = memberVerdicts(context);
  const design = designMembers(model, result, { standard });
  const wholeRoof = model.members.length <= wholeRoofCheckMembers;
  const certificate = wholeRoof ? storedAnyLoad(model, idleForAnyLoad(context)) : null;
  const members: Record<string, StoredMemberReview> = {};
  model.members.forEach((member, e) => {
    const v = verdicts[e];
    const d = design[e];
    members[member.id] = {
      verdict: v.verdict,
      reason: v.reason,
      ...(v.braces ? { braces: v.braces } : {}),
      utilisation: d.governing ? d.governing.utilisation : null,
      governing: d.governing,
      checks: d.checks,
      warnings: d.warnings,
      ...(certificate ? { anyLoad: certificate.members[member.id] } : {}),
    };
  });
  // the patterns analysed, shown next to every "idle" verdict at any roof size: idle depends on them
  const patterns: AnalysedPattern[] = model.loadCases.map((c) => ({ id: c.id, name: c.name }));
  const deflections = checkDeflections(model, result, deflectionLimit);
  if (!certificate) {
    const leftOut = `Overall stability and "idle for any roof load" are checked with the analysis for roofs of up to ${wholeRoofCheckMembers.toLocaleString("en")} members; this one has ${model.members.length.toLocaleString("en")}. "Idle for any roof load" can be run for the whole roof as a job from the viewer.`;
    return { standard, caution: STANDING_CAUTION, analysedPatterns: patterns, members, deflections, deflectionLimit, wholeRoofChecksLeftOut: leftOut };
  }
  return { standard, caution: STANDING_CAUTION, analysedPatterns: patterns, members, deflections, deflectionLimit, stability: storedStability(overallStability(context)), anyLoad: certificate.anyLoad };
}
