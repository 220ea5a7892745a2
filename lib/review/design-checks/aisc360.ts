// AISC 360-22 axial checks for round HSS truss members: D2 tension yielding and E3 flexural buckling (LRFD).
import type { AxialCheck, CalcStep, MemberDesignInput } from "./types";
import { sig, toMm, toMm2, toMPa } from "./units";

export const AISC_PHI_T = 0.9;
export const AISC_PHI_C = 0.9;
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

function commonSteps(input: MemberDesignInput): CalcStep[] {
  return [
    { label: "Gross area Ag", value: sig(toMm2(input.area)), unit: "mm²" },
    { label: "Yield stress Fy", value: sig(toMPa(input.fy)), unit: "MPa" },
  ];
}

/** D2(a) tension yielding: φt Pn = 0.90 Fy Ag, in kN. */
export function aiscTension(input: MemberDesignInput, force: number): AxialCheck {
  const resistance = AISC_PHI_T * input.fy * input.area;
  const slenderness = input.length / input.radiusOfGyration;
  const steps: CalcStep[] = [
    ...commonSteps(input),
    { label: "Nominal strength Pn", expression: "Fy·Ag", value: sig(input.fy * input.area), unit: "kN" },
    { label: "Design strength φt·Pn", expression: "0.90·Fy·Ag", value: sig(resistance), unit: "kN" },
    { label: "Slenderness L/r", expression: `${sig(toMm(input.length))} mm / ${sig(toMm(input.radiusOfGyration))} mm`, value: sig(slenderness, 4), unit: "–" },
  ];
  const warnings: string[] = [];
  if (slenderness > AISC_TENSION_SLENDERNESS_LIMIT) {
    warnings.push(`L/r = ${sig(slenderness, 4)} exceeds 300, the preferred limit for tension members (AISC 360-22 D1 user note).`);
  }
  return finish("tension", force, resistance, "AISC 360-22 D2(a) tension yielding", steps, warnings);
}

/** E3 design compressive strength φc·Fcr·Ag (kN) with Lc = K·L, and the values behind it. */
export function aiscCompressionStrength(input: MemberDesignInput) {
  const Lc = input.effectiveLengthFactor * input.length;
  const slenderness = Lc / input.radiusOfGyration;
  const stress = aiscCriticalStress(input.fy, input.E, slenderness);
  return { Lc, slenderness, ...stress, resistance: AISC_PHI_C * stress.Fcr * input.area };
}

/** E3 flexural buckling: φc Pn = 0.90 Fcr Ag, with Lc = K·L, in kN. */
export function aiscCompression(input: MemberDesignInput, force: number): AxialCheck {
  const { Lc, slenderness, Fe, Fcr, transition, inelastic, resistance } = aiscCompressionStrength(input);
  const steps: CalcStep[] = [
    ...commonSteps(input),
    { label: "Modulus E", value: sig(toMPa(input.E)), unit: "MPa" },
    { label: "Member length L", value: sig(input.length), unit: "m" },
    { label: "Effective length factor K", value: input.effectiveLengthFactor, unit: "–" },
    { label: "Effective length Lc", expression: "K·L", value: sig(Lc), unit: "m" },
    { label: "Radius of gyration r", value: sig(toMm(input.radiusOfGyration)), unit: "mm" },
    { label: "Slenderness Lc/r", value: sig(slenderness, 4), unit: "–" },
    { label: "Elastic buckling stress Fe", expression: "π²E/(Lc/r)² (E3-4)", value: sig(toMPa(Fe)), unit: "MPa" },
    { label: "Limit 4.71·√(E/Fy)", value: sig(transition, 4), unit: "–" },
    inelastic
      ? { label: "Critical stress Fcr (inelastic)", expression: "0.658^(Fy/Fe)·Fy (E3-2)", value: sig(toMPa(Fcr)), unit: "MPa" }
      : { label: "Critical stress Fcr (elastic)", expression: "0.877·Fe (E3-3)", value: sig(toMPa(Fcr)), unit: "MPa" },
    { label: "Nominal strength Pn", expression: "Fcr·Ag (E3-1)", value: sig(Fcr * input.area), unit: "kN" },
    { label: "Design strength φc·Pn", expression: "0.90·Fcr·Ag", value: sig(resistance), unit: "kN" },
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
  return finish("compression", force, resistance, "AISC 360-22 E3 flexural buckling", steps, warnings);
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
