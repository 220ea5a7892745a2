/**
 * Strutroom's truss analysis engine: pure TypeScript (no React, no I/O, no Node-only APIs), so it runs in
 * route handlers, the realtime server, the command line and a browser Web Worker alike.
 */
export {
  trussModelSchema,
  validateModel,
  loadCategories,
  fabrications,
  combinationKinds,
  DEFAULT_FABRICATION,
  type Fabrication,
  type TrussModel,
  type TrussMaterial,
  type TrussSection,
  type TrussNode,
  type TrussMember,
  type TrussSupport,
  type LoadCase,
  type LoadCategory,
  type NodalLoad,
  type Combination,
  type ModelProblem,
  type ValidationResult,
} from "./model";
export { modelFromCsv, csvColumns } from "./csv";
export { steelGrades, ultimateStrength, MIN_FU_OVER_FY, type SteelGrade, type UltimateStrength } from "./grades";
export {
  analyzeModel,
  zeroForceMask,
  describeInstability,
  type AnalysisResult,
  type AnalysisInfo,
  type AnalyzeOptions,
  type CaseResult,
  type EnvelopeEntry,
} from "./analyze";
export { prepareStructure, PIVOT_TOLERANCE, type PreparedStructure, type Instability, type Direction } from "./prepare";
export { loadVectorForCase } from "./loads";
export { mechanismModes, nearMechanism, describeModes, describeDirection, movingJoints, type MechanismMode, type MovingJoint } from "./mechanism";
export { bucklingModes, ALPHA_CR_LIMIT, type BucklingMode, type BucklingAnalysis, type BucklingOptions } from "./buckling";
export { instabilityFromModes } from "./analyze";
export { planSpan } from "./plan-span";
export { generateRoof, roofParamsSchema, type RoofParams } from "./generator";
export { demoRoof } from "./demo-roof";
export { classifyMembers, type MemberClass } from "./classify";
export { handleAnalysisRequest, type AnalysisRequest, type AnalysisResponse } from "./worker-protocol";
