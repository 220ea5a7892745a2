// Opening what-if: a round or rectangular hole through both walls of a tube member, checked on its net section.
import { STANDING_CAUTION } from "./caution";
import { checkAxialForce } from "./design-checks/member-check";
import type { AxialCheck, CalcStep, DesignStandard, MemberDesignInput } from "./design-checks/types";
import { sig, toMm, toMm2 } from "./design-checks/units";

/** A hole through both walls, its axis crossing the tube axis at right angles; centre at `position` m from end i. */
export type OpeningSpec =
  | { shape: "round"; diameter: number; position: number }
  | { shape: "rectangular"; widthAcross: number; lengthAlong: number; position: number };

export type OpeningCombinationCheck = {
  combination: string;
  force: number;
  utilisationWithout: number;
  utilisationWith: number;
  check: AxialCheck;
};

export type OpeningVerdict = "within capacity on the checks made" | "over capacity" | "not feasible";

export type OpeningAssessment = {
  opening: OpeningSpec;
  grossArea: number;
  netArea: number;
  areaLossPercent: number;
  steps: CalcStep[];
  assumptions: string[];
  combinations: OpeningCombinationCheck[];
  governing: OpeningCombinationCheck | null;
  warnings: string[];
  notChecked: string[];
  verdict: OpeningVerdict;
  reasons: string[];
  caution: string;
};

export const OPENING_NOT_CHECKED = [
  "local buckling of the tube wall around the opening",
  "stress concentration at the opening edges",
  "fatigue",
  "connections and the joints at the member ends",
  "reinforcement (collars, sleeves, doubler plates)",
  "the reduced bending stiffness over the opening length (the member's buckling uses the gross radius of gyration)",
  "corrosion protection and fire protection of the cut edges",
];

/** Area of a disc of radius R inside the strip |y| ≤ a (a ≤ R). */
function discStripArea(R: number, a: number) {
  return 2 * (a * Math.sqrt(R * R - a * a) + R * R * Math.asin(a / R));
}

/**
 * Net area of a tube cut by a hole of width w across it, through both walls (exact annulus-minus-strip area).
 * Returns null when the hole is as wide as the bore, which would sever the side walls.
 */
export function chsNetArea(D: number, t: number, widthAcross: number): number | null {
  const Ro = D / 2;
  const Ri = Ro - t;
  const a = widthAcross / 2;
  if (a >= Ri) return null;
  const gross = Math.PI * (Ro * Ro - Ri * Ri);
  return gross - (discStripArea(Ro, a) - discStripArea(Ri, a));
}

type OpeningInput = {
  standard: DesignStandard;
  member: MemberDesignInput & { outerDiameter: number; wallThickness: number };
  opening: OpeningSpec;
  /** Axial force per combination (kN, tension positive). */
  forces: { combination: string; force: number }[];
};

/** Checks a member with an opening in it across every given combination and gives a verdict. */
export function assessOpening({ standard, member, opening, forces }: OpeningInput): OpeningAssessment {
  const D = member.outerDiameter;
  const t = member.wallThickness;
  const across = opening.shape === "round" ? opening.diameter : opening.widthAcross;
  const along = opening.shape === "round" ? opening.diameter : opening.lengthAlong;
  const netFromGeometry = chsNetArea(D, t, across);
  // The model's stated area governs the checks; the geometric loss is taken off it.
  const geometricGross = Math.PI * t * (D - t);
  const netArea = netFromGeometry === null ? 0 : member.area - (geometricGross - netFromGeometry);
  const assumptions = [
    "The opening passes through both walls, its axis crossing the tube axis at right angles.",
    "Net area = gross area − the part of the ring inside the strip |y| ≤ w/2 (w = width across); for small w this is ≈ 2·t·w, and slightly more because the cut follows the curved wall.",
    "Tension: yielding of the gross area and rupture of the net area, the smaller governing (EN 1993-1-1 6.2.3(2): Npl,Rd = A·fy/γM0, Nu,Rd = 0.9·Anet·fu/γM2, γM2 = 1.25; AISC 360-22 D2: φt = 0.90 on Ag, 0.75 on Ae = An with U = 1 away from connections).",
    "Compression: member buckling with the gross slenderness, resisted by the net area (conservative for a short opening).",
  ];
  const steps: CalcStep[] = [
    { label: "Tube D × t", value: `${sig(toMm(D))} × ${sig(toMm(t))}`, unit: "mm" },
    { label: "Opening width across w", value: sig(toMm(across)), unit: "mm" },
    { label: "Opening length along", value: sig(toMm(along)), unit: "mm" },
    { label: "Gross area A", value: sig(toMm2(member.area)), unit: "mm²" },
    { label: "Thin-wall estimate of the loss", expression: "2·t·w", value: sig(toMm2(2 * t * across)), unit: "mm²" },
  ];
  const reasons: string[] = [];
  const warnings: string[] = [];
  const start = opening.position - along / 2;
  const end = opening.position + along / 2;
  if (netFromGeometry === null) reasons.push("The opening is as wide as the tube bore: it would cut through the side walls.");
  if (start < 0 || end > member.length) reasons.push("The opening does not lie wholly within the member length.");
  // Our own advisory rule: within one diameter of a joint the opening is in the connection region.
  if (reasons.length === 0 && (start < D || end > member.length - D)) {
    warnings.push("The opening is within one tube diameter of a joint: connection region, not checked here.");
  }
  if (reasons.length > 0) {
    return { opening, grossArea: member.area, netArea, areaLossPercent: 100, steps, assumptions, combinations: [], governing: null, warnings, notChecked: OPENING_NOT_CHECKED, verdict: "not feasible", reasons, caution: STANDING_CAUTION };
  }
  steps.push(
    { label: "Net area Anet", expression: "A − ring area inside |y| ≤ w/2", value: sig(toMm2(netArea)), unit: "mm²" },
    { label: "Area lost", value: sig((100 * (member.area - netArea)) / member.area, 3), unit: "%" },
  );
  // Tension: gross yielding and net rupture (6.2.3(2), D2); compression: the net area resists, gross slenderness.
  const inTension = { ...member, netArea };
  const inCompression = { ...member, area: netArea };
  const combinations = forces.map(({ combination, force }) => {
    const gross = checkAxialForce(standard, member, force);
    const check = checkAxialForce(standard, force > 0 ? inTension : inCompression, force);
    return { combination, force, utilisationWithout: gross.utilisation, utilisationWith: check.utilisation, check };
  });
  const governing = combinations.reduce<OpeningCombinationCheck | null>((g, c) => (g === null || c.utilisationWith > g.utilisationWith ? c : g), null);
  const over = governing !== null && governing.utilisationWith > 1;
  if (over) reasons.push(`Utilisation with the opening is ${sig(governing.utilisationWith, 3)} under ${governing.combination}.`);
  return {
    opening,
    grossArea: member.area,
    netArea,
    areaLossPercent: (100 * (member.area - netArea)) / member.area,
    steps,
    assumptions,
    combinations,
    governing,
    warnings,
    notChecked: OPENING_NOT_CHECKED,
    verdict: over ? "over capacity" : "within capacity on the checks made",
    reasons,
    caution: STANDING_CAUTION,
  };
}
