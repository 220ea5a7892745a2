// EN 1993-1-1 axial checks for tube truss members: 6.2.3 tension (gross yielding, net-section rupture at holes)
// and 6.3.1 flexural buckling with the Table 6.2 curve of the section's fabrication.
import { finish } from "./aisc360";
import type { AxialCheck, CalcStep, ChsFabrication, MemberDesignInput } from "./types";
import { sig, toMm, toMm2, toMPa } from "./units";

/** Recommended partial factors (EN 1993-1-1 6.1 NOTE 2B). */
export const EN_GAMMA_M0 = 1.0;
export const EN_GAMMA_M1 = 1.0;
/** γM2 for the net section in tension (6.1 NOTE 2B recommended value, from memory: 1.25). */
export const EN_GAMMA_M2 = 1.25;
/**
 * EN 1993-1-1 sets no slenderness limit. Common practice (not a Eurocode rule; the BS 5950-1 4.7.3.2 limits,
 * quoted from memory): λ ≤ 180 for members carrying compression from loads other than wind, 350 for ties.
 */
export const EN_COMPRESSION_SLENDERNESS_LIMIT = 180;
export const EN_TENSION_SLENDERNESS_LIMIT = 350;

export type BucklingCurve = "a0" | "a" | "b" | "c" | "d";

/** Imperfection factor α per buckling curve (Table 6.1). */
export const IMPERFECTION_FACTOR: Record<BucklingCurve, number> = { a0: 0.13, a: 0.21, b: 0.34, c: 0.49, d: 0.76 };

/** Table 6.2 for hollow sections: hot finished curve a (a0 for S460), cold formed curve c. fy in kPa. */
export function chsBucklingCurve(fabrication: ChsFabrication, fy: number): BucklingCurve {
  if (fabrication === "cold-formed") return "c";
  return fy >= 460_000 ? "a0" : "a";
}

/** Reduction factor χ for non-dimensional slenderness λ̄ (6.49): Φ = 0.5[1 + α(λ̄ − 0.2) + λ̄²]. */
export function reductionFactor(lambdaBar: number, curve: BucklingCurve) {
  const alpha = IMPERFECTION_FACTOR[curve];
  const phi = 0.5 * (1 + alpha * (lambdaBar - 0.2) + lambdaBar ** 2);
  const chi = Math.min(1, 1 / (phi + Math.sqrt(phi ** 2 - lambdaBar ** 2)));
  return { alpha, phi, chi };
}

function fabricationStep(input: MemberDesignInput): CalcStep {
  return {
    label: "Fabrication",
    expression: input.fabricationDefaulted ? "not stated by the section: model default" : "stated by the section",
    value: input.fabrication,
    unit: "–",
  };
}

/**
 * 6.2.3 tension strength (kN): Npl,Rd = A·fy/γM0 on the gross area (6.6); at a hole or opening also
 * Nu,Rd = 0.9·Anet·fu/γM2 on the net area (6.7), the smaller governing (6.2.3(2)).
 */
export function enTensionStrength(input: MemberDesignInput) {
  const plastic = (input.area * input.fy) / EN_GAMMA_M0;
  const ultimate = input.netArea === undefined ? Infinity : (0.9 * input.netArea * input.fu) / EN_GAMMA_M2;
  return { plastic, ultimate, resistance: Math.min(plastic, ultimate), ultimateGoverns: ultimate < plastic };
}

/** 6.2.3 tension: Nt,Rd = min(Npl,Rd, Nu,Rd), in kN. */
export function enTension(input: MemberDesignInput, force: number): AxialCheck {
  const { plastic, ultimate, resistance, ultimateGoverns } = enTensionStrength(input);
  const slenderness = input.length / input.radiusOfGyration;
  const steps: CalcStep[] = [
    fabricationStep(input),
    { label: "Gross area A", value: sig(toMm2(input.area)), unit: "mm²" },
    { label: "Yield strength fy", value: sig(toMPa(input.fy)), unit: "MPa" },
    { label: "γM0 (recommended)", value: EN_GAMMA_M0, unit: "–" },
    { label: "Plastic resistance Npl,Rd", expression: "A·fy/γM0 (6.6), gross area", value: sig(plastic), unit: "kN" },
  ];
  if (input.netArea !== undefined) {
    steps.push(
      { label: "Net area Anet", value: sig(toMm2(input.netArea)), unit: "mm²" },
      { label: "Ultimate strength fu", expression: input.fuSource, value: sig(toMPa(input.fu)), unit: "MPa" },
      { label: "γM2 (recommended)", value: EN_GAMMA_M2, unit: "–" },
      { label: "Net-section resistance Nu,Rd", expression: "0.9·Anet·fu/γM2 (6.7)", value: sig(ultimate), unit: "kN" },
      { label: "Tension resistance Nt,Rd", expression: `smaller of Npl,Rd and Nu,Rd (6.2.3(2)): ${ultimateGoverns ? "net section" : "gross yielding"} governs`, value: sig(resistance), unit: "kN" },
    );
  }
  steps.push({ label: "Slenderness L/i", value: sig(slenderness, 4), unit: "–" });
  const warnings: string[] = [];
  if (slenderness > EN_TENSION_SLENDERNESS_LIMIT) {
    warnings.push(`L/i = ${sig(slenderness, 4)} exceeds 350 (common-practice limit for ties; EN 1993-1-1 sets none).`);
  }
  return finish("tension", force, resistance, ultimateGoverns ? "EN 1993-1-1 6.2.3(2)b net section" : "EN 1993-1-1 6.2.3(2)a tension yielding", steps, warnings);
}

/** 6.3.1 compression resistance (kN) under force NEd, and the values behind it. */
export function enCompressionStrength(input: MemberDesignInput, force: number, curve: BucklingCurve) {
  const Lcr = input.effectiveLengthFactor * input.length;
  const slenderness = Lcr / input.radiusOfGyration;
  const Ncr = (Math.PI ** 2 * input.E * input.area * input.radiusOfGyration ** 2) / Lcr ** 2;
  const lambdaBar = Math.sqrt((input.area * input.fy) / Ncr);
  const { alpha, phi, chi } = reductionFactor(lambdaBar, curve);
  // 6.3.1.2(4): buckling may be ignored for λ̄ ≤ 0.2 or NEd/Ncr ≤ 0.04; only the cross-section check remains.
  const ignoreBuckling = lambdaBar <= 0.2 || Math.abs(force) / Ncr <= 0.04;
  const resistance = ignoreBuckling ? (input.area * input.fy) / EN_GAMMA_M0 : (chi * input.area * input.fy) / EN_GAMMA_M1;
  return { Lcr, slenderness, Ncr, lambdaBar, alpha, phi, chi, ignoreBuckling, resistance };
}

/** 6.3.1 flexural buckling: Nb,Rd = χ·A·fy/γM1 with the CHS curve of Table 6.2, in kN. */
export function enCompression(input: MemberDesignInput, force: number, curve = chsBucklingCurve(input.fabrication, input.fy)): AxialCheck {
  const { Lcr, slenderness, Ncr, lambdaBar, alpha, phi, chi, ignoreBuckling, resistance } = enCompressionStrength(input, force, curve);
  const steps: CalcStep[] = [
    fabricationStep(input),
    { label: "Area A", value: sig(toMm2(input.area)), unit: "mm²" },
    { label: "Yield strength fy", value: sig(toMPa(input.fy)), unit: "MPa" },
    { label: "Modulus E", value: sig(toMPa(input.E)), unit: "MPa" },
    { label: "Member length L", value: sig(input.length), unit: "m" },
    { label: "Effective length factor", value: input.effectiveLengthFactor, unit: "–" },
    { label: "Buckling length Lcr", value: sig(Lcr), unit: "m" },
    { label: "Radius of gyration i", value: sig(toMm(input.radiusOfGyration)), unit: "mm" },
    { label: "Slenderness Lcr/i", value: sig(slenderness, 4), unit: "–" },
    { label: "Elastic critical force Ncr", expression: "π²·E·A·i²/Lcr²", value: sig(Ncr), unit: "kN" },
    { label: "Non-dimensional slenderness λ̄", expression: "√(A·fy/Ncr) (6.50)", value: sig(lambdaBar, 4), unit: "–" },
    { label: "Buckling curve", expression: `Table 6.2, ${input.fabrication} hollow section`, value: curve, unit: "–" },
    { label: "Imperfection factor α", expression: "Table 6.1", value: alpha, unit: "–" },
    { label: "Φ", expression: "0.5·[1 + α(λ̄ − 0.2) + λ̄²]", value: sig(phi, 4), unit: "–" },
    ignoreBuckling
      ? { label: "Reduction factor χ", expression: "buckling ignored: λ̄ ≤ 0.2 or NEd/Ncr ≤ 0.04 (6.3.1.2(4))", value: 1, unit: "–" }
      : { label: "Reduction factor χ", expression: "1/(Φ + √(Φ² − λ̄²)) ≤ 1 (6.49)", value: sig(chi, 4), unit: "–" },
    ignoreBuckling
      ? { label: "Resistance Nc,Rd", expression: "A·fy/γM0 (6.10)", value: sig(resistance), unit: "kN" }
      : { label: "Buckling resistance Nb,Rd", expression: "χ·A·fy/γM1 (6.47), γM1 = 1.0", value: sig(resistance), unit: "kN" },
  ];
  const warnings: string[] = [];
  if (slenderness > EN_COMPRESSION_SLENDERNESS_LIMIT) {
    warnings.push(`Lcr/i = ${sig(slenderness, 4)} exceeds 180 (common-practice limit for compression members; EN 1993-1-1 sets none).`);
  }
  if (input.outerDiameter && input.wallThickness) {
    // Table 5.2 (limit from memory): CHS class 3 when d/t ≤ 90·ε², ε² = 235/fy.
    const ratio = input.outerDiameter / input.wallThickness;
    const limit = 90 * (235 / toMPa(input.fy));
    if (ratio > limit) warnings.push(`d/t = ${sig(ratio, 4)} exceeds 90·ε² = ${sig(limit, 4)}: class 4 section, effective area not checked here.`);
  }
  return finish("compression", force, resistance, "EN 1993-1-1 6.3.1 flexural buckling", steps, warnings);
}
