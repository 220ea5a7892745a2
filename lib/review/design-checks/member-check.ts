import { aiscCompression, aiscTension } from "./aisc360";
import { enCompression, enTension } from "./en1993";
import type { AxialCheck, DesignStandard, MemberDesignInput } from "./types";

/** Checks one member under one axial force (tension positive, kN) to the chosen standard. */
export function checkAxialForce(standard: DesignStandard, input: MemberDesignInput, force: number): AxialCheck {
  if (force > 0) return standard === "AISC360-22" ? aiscTension(input, force) : enTension(input, force);
  if (force < 0) return standard === "AISC360-22" ? aiscCompression(input, force) : enCompression(input, force);
  return { mode: "none", force: 0, resistance: 0, utilisation: 0, clause: "no axial force", steps: [], warnings: [] };
}
