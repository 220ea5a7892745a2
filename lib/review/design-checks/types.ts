/** Design standards the review engine can check members against. */
export type DesignStandard = "AISC360-22" | "EN1993-1-1";

/** How a hollow section was made; it selects the EN 1993-1-1 buckling curve (Table 6.2). */
export type ChsFabrication = "hot-finished" | "cold-formed";

/** One labelled line of arithmetic so a reviewer can follow a check. */
export type CalcStep = { label: string; expression?: string; value: number | string; unit: string };

/**
 * A member's data for one axial check, in model units: m, m², kPa (kN/m²). Resistances come out in kN.
 * outerDiameter/wallThickness are optional (used only for the section-class warnings).
 */
export type MemberDesignInput = {
  length: number;
  area: number;
  radiusOfGyration: number;
  E: number;
  fy: number;
  effectiveLengthFactor: number;
  fabrication: ChsFabrication;
  outerDiameter?: number;
  wallThickness?: number;
};

/** The outcome of one member check under one axial force (tension positive, kN). */
export type AxialCheck = {
  mode: "tension" | "compression" | "none";
  force: number;
  resistance: number;
  utilisation: number;
  clause: string;
  steps: CalcStep[];
  warnings: string[];
};
