/** Design standards the review engine can check members against. */
export type DesignStandard = "AISC360-22" | "EN1993-1-1";

/**
 * How a hollow section was made: the EN 1993-1-1 buckling curve (Table 6.2) and the AISC design wall thickness
 * (B4.2) depend on it.
 */
export type ChsFabrication = "hot-finished" | "cold-formed";

/** AISC 360-22 design basis: load and resistance factors, or allowable strength (B3.1, B3.2). */
export type DesignMethod = "LRFD" | "ASD";

/** One labelled line of arithmetic so a reviewer can follow a check. */
export type CalcStep = { label: string; expression?: string; value: number | string; unit: string };

/**
 * A member's data for one axial check, in model units: m, m², kPa (kN/m²). Resistances come out in kN.
 * outerDiameter/wallThickness are optional (section-class warnings and the AISC design wall thickness).
 */
export type MemberDesignInput = {
  length: number;
  area: number;
  radiusOfGyration: number;
  E: number;
  fy: number;
  /** Ultimate tensile strength (kPa) and where it came from (model, grade table or the ductility minimum). */
  fu: number;
  fuSource?: string;
  effectiveLengthFactor: number;
  fabrication: ChsFabrication;
  /** True when the fabrication is the model format's default rather than stated by the section. */
  fabricationDefaulted?: boolean;
  /** AISC only: LRFD unless ASD is asked for. */
  method?: DesignMethod;
  /** Net area (m²) at a hole or opening; absent when the member has none. */
  netArea?: number;
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
