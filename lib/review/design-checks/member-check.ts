import { aiscCompression, aiscCompressionStrength, aiscTension, aiscTensionStrength } from "./aisc360";
import { chsBucklingCurve, EN_GAMMA_M0, enCompression, enCompressionStrength, enTension, enTensionStrength } from "./en1993";
import type { AxialCheck, DesignStandard, MemberDesignInput } from "./types";

/** Checks one member under one axial force (tension positive, kN) to the chosen standard. */
export function checkAxialForce(standard: DesignStandard, input: MemberDesignInput, force: number): AxialCheck {
  if (force > 0) return standard === "AISC360-22" ? aiscTension(input, force) : enTension(input, force);
  if (force < 0) return standard === "AISC360-22" ? aiscCompression(input, force) : enCompression(input, force);
  return { mode: "none", force: 0, resistance: 0, utilisation: 0, clause: "no axial force", steps: [], warnings: [] };
}

/** The design resistance (kN) alone, for the sign of `force`: the fast path for whole-model sweeps. */
export function axialResistance(standard: DesignStandard, input: MemberDesignInput, force: number): number {
  if (force > 0) return standard === "AISC360-22" ? aiscTensionStrength(input).resistance : enTensionStrength(input).resistance;
  if (standard === "AISC360-22") return aiscCompressionStrength(input).resistance;
  return enCompressionStrength(input, force, chsBucklingCurve(input.fabrication, input.fy)).resistance;
}

/** Utilisation |N| / resistance for one force (0 for no force). */
export function axialUtilisation(standard: DesignStandard, input: MemberDesignInput, force: number): number {
  return force === 0 ? 0 : Math.abs(force) / axialResistance(standard, input, force);
}

/** Per-member resistances that do not depend on the force, for fast whole-model sweeps (kN). */
export type ResistanceTable = {
  tension: Float64Array;
  /** Flexural buckling resistance. */
  compression: Float64Array;
  /** EN 1993-1-1 6.3.1.2(4): section resistance used when NEd/Ncr ≤ 0.04 (Infinity-free: 0 for AISC). */
  compressionSmallForce: Float64Array;
  /** Ncr (kN) for the 0.04 rule; 0 for AISC (the rule does not exist there). */
  ncr: Float64Array;
};

/** Builds the resistance table; `tableUtilisation` then gives the same numbers as axialUtilisation. */
export function resistanceTable(standard: DesignStandard, inputs: MemberDesignInput[]): ResistanceTable {
  const m = inputs.length;
  const table = { tension: new Float64Array(m), compression: new Float64Array(m), compressionSmallForce: new Float64Array(m), ncr: new Float64Array(m) };
  inputs.forEach((input, e) => {
    table.tension[e] = axialResistance(standard, input, 1);
    if (standard === "AISC360-22") {
      table.compression[e] = aiscCompressionStrength(input).resistance;
      return;
    }
    // Ask for the buckling resistance with a force large enough that the 0.04 rule cannot apply.
    const strength = enCompressionStrength(input, -Infinity, chsBucklingCurve(input.fabrication, input.fy));
    table.ncr[e] = strength.Ncr;
    table.compression[e] = strength.resistance; // A·fy/γM0 when λ̄ ≤ 0.2, else χ·A·fy/γM1
    table.compressionSmallForce[e] = (input.area * input.fy) / EN_GAMMA_M0;
  });
  return table;
}

/** Resistance (kN) of member e for the sign of `force`, from a resistance table (0 for no force). */
export function tableResistance(table: ResistanceTable, e: number, force: number): number {
  if (force > 0) return table.tension[e];
  if (force === 0) return 0;
  return table.ncr[e] > 0 && -force / table.ncr[e] <= 0.04 ? table.compressionSmallForce[e] : table.compression[e];
}

/** Utilisation of member e under `force` from a resistance table. */
export function tableUtilisation(table: ResistanceTable, e: number, force: number): number {
  return force === 0 ? 0 : Math.abs(force) / tableResistance(table, e, force);
}
