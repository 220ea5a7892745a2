// Steel grades and their nominal strengths, used where a model material states no ultimate strength fu.
import type { TrussMaterial } from "./model";

export type SteelGrade = {
  /** Grade name as written in the product standard (also accepted as a material id). */
  grade: string;
  standard: string;
  /** Nominal yield and ultimate tensile strength, kPa (t ≤ 40 mm; thicker walls step down). */
  fy: number;
  fu: number;
  source: string;
};

const MPA = 1000;
const KSI = 6894.757;
const enTable = "EN 1993-1-1:2005 Table 3.1, t ≤ 40 mm (values from memory)";

/**
 * Usual nominal strengths per grade from the product standards. EN rows as listed in EN 1993-1-1 Table 3.1
 * (from memory); US rows: A500 Gr C round 46/62 ksi confirmed (check-values §6), A992 50/65 confirmed, the
 * others from memory.
 */
export const steelGrades: SteelGrade[] = [
  { grade: "S235", standard: "EN 10025-2", fy: 235 * MPA, fu: 360 * MPA, source: enTable },
  { grade: "S275", standard: "EN 10025-2", fy: 275 * MPA, fu: 430 * MPA, source: enTable },
  { grade: "S355", standard: "EN 10025-2", fy: 355 * MPA, fu: 510 * MPA, source: enTable },
  { grade: "S460", standard: "EN 10025-3 (S460N)", fy: 460 * MPA, fu: 540 * MPA, source: enTable },
  { grade: "S235H", standard: "EN 10210-1 / EN 10219-1", fy: 235 * MPA, fu: 360 * MPA, source: enTable },
  { grade: "S275H", standard: "EN 10210-1 / EN 10219-1", fy: 275 * MPA, fu: 430 * MPA, source: enTable },
  { grade: "S355H", standard: "EN 10210-1 / EN 10219-1", fy: 355 * MPA, fu: 510 * MPA, source: enTable },
  { grade: "S355NH", standard: "EN 10210-1 (hot finished)", fy: 355 * MPA, fu: 490 * MPA, source: enTable },
  { grade: "S460NH", standard: "EN 10210-1 (hot finished)", fy: 460 * MPA, fu: 560 * MPA, source: enTable },
  { grade: "S355NH-CF", standard: "EN 10219-1 (cold formed)", fy: 355 * MPA, fu: 470 * MPA, source: enTable },
  { grade: "S460NH-CF", standard: "EN 10219-1 (cold formed)", fy: 460 * MPA, fu: 550 * MPA, source: enTable },
  { grade: "A500C", standard: "ASTM A500 Grade C, round", fy: 46 * KSI, fu: 62 * KSI, source: "ASTM A500 Gr C (check-values §6, confirmed)" },
  { grade: "A500B", standard: "ASTM A500 Grade B, round", fy: 42 * KSI, fu: 58 * KSI, source: "ASTM A500 Gr B (from memory)" },
  { grade: "A1085", standard: "ASTM A1085", fy: 50 * KSI, fu: 65 * KSI, source: "ASTM A1085 (from memory)" },
  { grade: "A53B", standard: "ASTM A53 Grade B", fy: 35 * KSI, fu: 60 * KSI, source: "ASTM A53 Gr B (from memory)" },
  { grade: "A992", standard: "ASTM A992", fy: 50 * KSI, fu: 65 * KSI, source: "ASTM A992 (check-values §6, confirmed)" },
];

/** EN 1993-1-1 3.2.2(1) ductility requirement fu/fy ≥ 1.10 (recommended value, from memory): the lowest fu a compliant steel has. */
export const MIN_FU_OVER_FY = 1.1;

export type UltimateStrength = { fu: number; source: string };

/**
 * The material's ultimate strength (kPa) and where it came from: the model's own fu; else the grade named by the
 * material id; else the plain grade with the same fy; else the ductility minimum 1.10·fy (conservative).
 */
export function ultimateStrength(material: Pick<TrussMaterial, "id" | "fy" | "fu">): UltimateStrength {
  if (material.fu !== undefined) return { fu: material.fu, source: "model material" };
  const key = material.id.toUpperCase().replace(/[\s_.]/g, "").replace(/GR(ADE)?/, "");
  const named = steelGrades.find((g) => g.grade === key);
  if (named && Math.abs(named.fy - material.fy) <= 0.005 * named.fy) return { fu: named.fu, source: `grade ${named.grade}, ${named.source}` };
  const byYield = steelGrades.find((g) => Math.abs(g.fy - material.fy) <= 0.005 * g.fy);
  if (byYield) return { fu: byYield.fu, source: `not in the model: taken from grade ${byYield.grade} with the same fy, ${byYield.source}` };
  return { fu: MIN_FU_OVER_FY * material.fy, source: "not in the model: taken as 1.10·fy, the EN 1993-1-1 3.2.2(1) ductility minimum (conservative)" };
}
