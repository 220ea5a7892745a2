/**
 * Strutroom's member review engine: design checks, why a member is zero, removal and opening what-ifs,
 * influence maps and hung-services loads. Pure TypeScript on lib/analysis; plain JSON-serialisable results.
 *
 * Usage: `const context = createReviewContext(model, result, { standard })` factors the model once; pass it to
 * `reviewModel`, `removalWhatIf`, `openingWhatIf`, `influenceMap` and `compareServicesLoad` to reuse it.
 */
import type { ReviewContext } from "./context";
import { assessOpening, type OpeningAssessment, type OpeningSpec } from "./opening";

export { STANDING_CAUTION } from "./caution";
export { createReviewContext, type ReviewContext, type ReviewOptions } from "./context";
export { reviewModel, type ModelReview, type MemberReview } from "./review-model";
export { removalWhatIf, type RemovalRequest, type RemovalOutcome, type ResultChanges, type ForceChange, type LostBrace, type UtilisationChange } from "./removal";
export { overallStability, STABILITY_TOLERANCE, type OverallStability, type ResultStability } from "./overall-stability";
export { idleForAnyLoad, ANY_LOAD_RELATIVE, ANY_LOAD_ABSOLUTE, type AnyLoadCertificate, type AnyLoadOptions, type MemberAnyLoad, type InfluencePeak, type LoadAxis } from "./any-load";
export { checkDeflections, deflectionSpan, DEFAULT_DEFLECTION_LIMIT, type DeflectionCheck } from "./deflection";
export { memberVerdicts, type MemberVerdict } from "./verdicts";
export { explainZeroForces, inspectZeroForces, type WhyZero, type InspectionStep, type ZeroRule } from "./why-zero";
export { influenceMap, topLayerNodes, type InfluenceMap } from "./influence";
export { servicesLoadCase, compareServicesLoad, type ServiceRun, type Hanger, type ServicesLoad, type ServicesComparison, type ServicesLoadOptions } from "./services-load";
export { chsNetArea, OPENING_NOT_CHECKED, type OpeningSpec, type OpeningAssessment, type OpeningVerdict } from "./opening";
export { chsProperties, type ChsProperties } from "./design-checks/chs";
export { checkAxialForce, axialResistance, axialUtilisation } from "./design-checks/member-check";
export type { AxialCheck, CalcStep, ChsFabrication, DesignMethod, DesignStandard, MemberDesignInput } from "./design-checks/types";

/** Opening what-if for one member of the model: gross yielding and net-section checks across the design results. */
export function openingWhatIf(context: ReviewContext, memberId: string, opening: OpeningSpec): OpeningAssessment {
  const e = context.memberIndex.get(memberId);
  if (e === undefined) throw new Error(`no member "${memberId}"`);
  const input = context.inputs[e];
  if (!input.outerDiameter || !input.wallThickness) throw new Error(`member "${memberId}" has no tube diameter and wall thickness`);
  const zero = context.designResults.map((id) => new Set(context.result.results[id].zeroForceMembers));
  return assessOpening({
    standard: context.options.standard,
    member: { ...input, outerDiameter: input.outerDiameter, wallThickness: input.wallThickness },
    opening,
    forces: context.designResults.map((id, k) => ({ combination: id, force: zero[k].has(memberId) ? 0 : context.forces.get(id)![e] })),
  });
}
