// AISC 360-22 axial checks for round HSS truss members: D2 tension yielding and rupture, E3 flexural buckling
// (LRFD or ASD), on the B4.2 design wall thickness for ERW tubes.
import type { AxialCheck, CalcStep, MemberDesignInput } from "./types";
import { sig, toMm, toMm2, toMPa } from "./units";

export const AISC_PHI_T = 0.9;
export const AISC_PHI_C = 0.9;
/** D2(b) tension rupture: φt = 0.75 (LRFD), Ωt = 2.00 (ASD). */
export const AISC_PHI_T_RUPTURE = 0.75;
/** ASD safety factors: Ωt = 1.67 yielding, 2.00 rupture (D2), Ωc = 1.67 (E1); Ωt values from memory. */
export const AISC_OMEGA_T = 1.67;
export const AISC_OMEGA_T_RUPTURE = 2.0;
export const AISC_OMEGA_C = 1.67;
/** B4.2 design wall thickness of ERW (cold-formed) HSS: 0.93 × nominal (from memory; A1085 and hot-finished use t). */
export const AISC_ERW_THICKNESS_FACTOR = 0.93;
/** User notes to D1 and E2: slenderness preferably not over 300 (tension) and 200 (compression). */
export const AISC_TENSION_SLENDERNESS_LIMIT = 300;
export const AISC_COMPRESSION_SLENDERNESS_LIMIT = 200;

/** E3 critical stress for slenderness Lc/r; any consistent stress units (E3-2, E3-3, E3-4). */
export function aiscCriticalStress(Fy: number, E: number, slenderness: number) {
  const Fe = (Math.PI ** 2 * E) / slenderness ** 2;
  const transition = 4.71 * Math.sqrt(E / Fy);
  const inelastic = slenderness <= transition;
  const Fcr = inelastic ? 0.658 ** (Fy / Fe) * Fy : 0.877 * Fe;
  return { Fe, Fcr, transition, inelastic };
}

/**
 * Area and radius of gyration the checks use: for an ERW (cold-formed) tube with known D and t, those of the
 * design wall 0.93·t (B4.2); without D and t the area is scaled by 0.93 and r kept. Hot finished: nominal.
 */
export function aiscDesignSection(input: MemberDesignInput) {
  if (input.fabrication !== "cold-formed") return { area: input.area, radiusOfGyration: input.radiusOfGyration, thickness: input.wallThickness, reduced: false };
  const D = input.outerDiameter;
  const t = input.wallThickness;
  if (D && t) {
    const td = AISC_ERW_THICKNESS_FACTOR * t;
    const d = D - 2 * td;
    // the model's area may differ slightly from π t (D − t): keep its ratio to the geometric nominal area
    const ratio = input.area / (Math.PI * t * (D - t));
    return { area: ratio * Math.PI * td * (D - td), radiusOfGyration: Math.sqrt(D * D + d * d) / 4, thickness: td, reduced: true };
  }
  return { area: AISC_ERW_THICKNESS_FACTOR * input.area, radiusOfGyration: input.radiusOfGyration, thickness: undefined, reduced: true };
}

const asd = (input: MemberDesignInput) => input.method === "ASD";

function commonSteps(input: MemberDesignInput): CalcStep[] {
  const section = aiscDesignSection(input);
  const steps: CalcStep[] = [
    {
      label: "Fabrication",
      expression: input.fabricationDefaulted ? "not stated by the section: model default" : "stated by the section",
      value: input.fabrication === "cold-formed" ? "cold-formed (ERW)" : "hot-finished",
      unit: "–",
    },
  ];
  if (section.reduced) {
    steps.push(
      section.thickness !== undefined
        ? { label: "Design wall thickness t_des", expression: "0.93·t for ERW HSS (B4.2)", value: sig(toMm(section.thickness)), unit: "mm" }
        : { label: "Design wall thickness", expression: "0.93·t for ERW HSS (B4.2): area scaled by 0.93 (no D, t given)", value: 0.93, unit: "–" },
    );
  }
  steps.push(
    { label: section.reduced ? "Design gross area Ag" : "Gross area Ag", value: sig(toMm2(section.area)), unit: "mm²" },
    { label: "Yield stress Fy", value: sig(toMPa(input.fy)), unit: "MPa" },
  );
  return steps;
}

/** D2 tension strength (kN): the smaller of yielding on Ag and rupture on Ae = An·U (U = 1), LRFD or ASD. */
export function aiscTensionStrength(input: MemberDesignInput) {
  const { area } = aiscDesignSection(input);
  // a hole takes the same share of the design area as of the nominal one
  const netArea = input.netArea === undefined ? area : (area * input.netArea) / input.area;
  const yielding = asd(input) ? (input.fy * area) / AISC_OMEGA_T : AISC_PHI_T * input.fy * area;
  const rupture = asd(input) ? (input.fu * netArea) / AISC_OMEGA_T_RUPTURE : AISC_PHI_T_RUPTURE * input.fu * netArea;
  return { area, netArea, yielding, rupture, resistance: Math.min(yielding, rupture), ruptureGoverns: rupture < yielding };
}

/** D2 tension: (a) yielding of the gross section and (b) rupture of the net section, in kN. */
export function aiscTension(input: MemberDesignInput, force: number): AxialCheck {
  const { area, netArea, yielding, rupture, resistance, ruptureGoverns } = aiscTensionStrength(input);
  const slenderness = input.length / input.radiusOfGyration;
  const a = asd(input);
  const steps: CalcStep[] = [
    ...commonSteps(input),
    { label: "Tensile strength Fu", expression: input.fuSource, value: sig(toMPa(input.fu)), unit: "MPa" },
    { label: "Yielding Pn", expression: "Fy·Ag (D2-1)", value: sig(input.fy * area), unit: "kN" },
    { label: a ? "Allowable yielding Pn/Ωt" : "Design yielding φt·Pn", expression: a ? "Fy·Ag/1.67" : "0.90·Fy·Ag", value: sig(yielding), unit: "kN" },
    {
      label: "Effective net area Ae",
      expression: input.netArea === undefined ? "An = Ag, U = 1 (no holes; shear lag at the connections not checked)" : "An at the opening, U = 1",
      value: sig(toMm2(netArea)),
      unit: "mm²",
    },
    { label: "Rupture Pn", expression: "Fu·Ae (D2-2)", value: sig(input.fu * netArea), unit: "kN" },
    { label: a ? "Allowable rupture Pn/Ωt" : "Design rupture φt·Pn", expression: a ? "Fu·Ae/2.00" : "0.75·Fu·Ae", value: sig(rupture), unit: "kN" },
    { label: a ? "Allowable tension" : "Design tension strength", expression: `smaller of the two: ${ruptureGoverns ? "rupture" : "yielding"} governs`, value: sig(resistance), unit: "kN" },
    { label: "Slenderness L/r", expression: `${sig(toMm(input.length))} mm / ${sig(toMm(input.radiusOfGyration))} mm`, value: sig(slenderness, 4), unit: "–" },
  ];
  const warnings: string[] = [];
  if (slenderness > AISC_TENSION_SLENDERNESS_LIMIT) {
    warnings.push(`L/r = ${sig(slenderness, 4)} exceeds 300, the preferred limit for tension members (AISC 360-22 D1 user note).`);
  }
  const clause = `AISC 360-22 D2${ruptureGoverns ? "(b) tension rupture" : "(a) tension yielding"} (${a ? "ASD" : "LRFD"})`;
  return finish("tension", force, resistance, clause, steps, warnings);
}

/** E3 design compressive strength φc·Fcr·Ag (kN) with Lc = K·L, and the values behind it. */
export function aiscCompressionStrength(input: MemberDesignInput) {
  const { area, radiusOfGyration } = aiscDesignSection(input);
  const Lc = input.effectiveLengthFactor * input.length;
  const slenderness = Lc / radiusOfGyration;
  const stress = aiscCriticalStress(input.fy, input.E, slenderness);
  const nominal = stress.Fcr * area;
  return { Lc, slenderness, radiusOfGyration, area, ...stress, nominal, resistance: asd(input) ? nominal / AISC_OMEGA_C : AISC_PHI_C * nominal };
}

/** E3 flexural buckling: φc Pn = 0.90 Fcr Ag, with Lc = K·L, in kN. */
export function aiscCompression(input: MemberDesignInput, force: number): AxialCheck {
  const { Lc, slenderness, radiusOfGyration, Fe, Fcr, transition, inelastic, nominal, resistance } = aiscCompressionStrength(input);
  const a = asd(input);
  const steps: CalcStep[] = [
    ...commonSteps(input),
    { label: "Modulus E", value: sig(toMPa(input.E)), unit: "MPa" },
    { label: "Member length L", value: sig(input.length), unit: "m" },
    { label: "Effective length factor K", value: input.effectiveLengthFactor, unit: "–" },
    { label: "Effective length Lc", expression: "K·L", value: sig(Lc), unit: "m" },
    { label: "Radius of gyration r", value: sig(toMm(radiusOfGyration)), unit: "mm" },
    { label: "Slenderness Lc/r", value: sig(slenderness, 4), unit: "–" },
    { label: "Elastic buckling stress Fe", expression: "π²E/(Lc/r)² (E3-4)", value: sig(toMPa(Fe)), unit: "MPa" },
    { label: "Limit 4.71·√(E/Fy)", value: sig(transition, 4), unit: "–" },
    inelastic
      ? { label: "Critical stress Fcr (inelastic)", expression: "0.658^(Fy/Fe)·Fy (E3-2)", value: sig(toMPa(Fcr)), unit: "MPa" }
      : { label: "Critical stress Fcr (elastic)", expression: "0.877·Fe (E3-3)", value: sig(toMPa(Fcr)), unit: "MPa" },
    { label: "Nominal strength Pn", expression: "Fcr·Ag (E3-1)", value: sig(nominal), unit: "kN" },
    a
      ? { label: "Allowable strength Pn/Ωc", expression: "Fcr·Ag/1.67", value: sig(resistance), unit: "kN" }
      : { label: "Design strength φc·Pn", expression: "0.90·Fcr·Ag", value: sig(resistance), unit: "kN" },
  ];
  const warnings: string[] = [];
  if (slenderness > AISC_COMPRESSION_SLENDERNESS_LIMIT) {
    warnings.push(`Lc/r = ${sig(slenderness, 4)} exceeds 200, the preferred limit for compression members (AISC 360-22 E2 user note).`);
  }
  if (input.outerDiameter && input.wallThickness) {
    // Table B4.1a, round HSS in axial compression: nonslender when D/t ≤ 0.11 E/Fy (limit from memory).
    const ratio = input.outerDiameter / input.wallThickness;
    const limit = (0.11 * input.E) / input.fy;
    if (ratio > limit) warnings.push(`D/t = ${sig(ratio, 4)} exceeds 0.11·E/Fy = ${sig(limit, 4)}: slender wall, E7 local buckling applies and is not checked here.`);
  }
  return finish("compression", force, resistance, `AISC 360-22 E3 flexural buckling (${a ? "ASD" : "LRFD"})`, steps, warnings);
}

/** Adds demand and utilisation lines to a check. */
export function finish(
  mode: "tension" | "compression",
  force: number,
  resistance: number,
  clause: string,
  steps: CalcStep[],
  warnings: string[],
): AxialCheck {
  const demand = Math.abs(force);
  const utilisation = demand / resistance;
  steps.push(
    { label: mode === "tension" ? "Required tension" : "Required compression", value: sig(demand), unit: "kN" },
    { label: "Utilisation", expression: "required / design strength", value: sig(utilisation, 4), unit: "–" },
  );
  return { mode, force, resistance, utilisation, clause, steps, warnings };
}
