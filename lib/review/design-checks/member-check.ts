import { AISC_PHI_T, aiscCompression, aiscCompressionStrength, aiscTension } from "./aisc360";
import { chsBucklingCurve, EN_GAMMA_M0, enCompression, enCompressionStrength, enTension } from "./en1993";
import type { AxialCheck, DesignStandard, MemberDesignInput } from "./types";

/** Checks one member under one axial force (tension positive, kN) to the chosen standard. */
export function checkAxialForce(standard: DesignStandard, input: MemberDesignInput, force: number): AxialCheck {
  if (force > 0) return standard === "AISC360-22" ? aiscTension(input, force) : enTension(input, force);
  if (force < 0) return standard === "AISC360-22" ? aiscCompression(input, force) : enCompression(input, force);
  return { mode: "none", force: 0, resistance: 0, utilisation: 0, clause: "no axial force", steps: [], warnings: [] };
}

/** The design resistance (kN) alone, for the sign of `force`: the fast path for whole-model sweeps. */
export function axialResistance(standard: DesignStandard, input: MemberDesignInput, force: number): number {
  if (force > 0) return standard === "AISC360-22" ? AISC_PHI_T * input.fy * input.area : (input.area * input.fy) / EN_GAMMA_M0;
  if (standard === "AISC360-22") return aiscCompressionStrength(input).resistance;
  return enCompressionStrength(input, force, chsBucklingCurve(input.fabrication, input.fy)).resistance;
}

/** Utilisation |N| / resistance for one force (0 for no force). */
export function axialUtilisation(standard: DesignStandard, input: MemberDesignInput, force: number): number {
  return force === 0 ? 0 : Math.abs(force) / axialResistance(standard, input, force);
}
