import { describe, expect, it } from "vitest";
import { STANDING_CAUTION } from "./caution";
import { chsProperties } from "./design-checks/chs";
import { assessOpening, chsNetArea } from "./opening";

/** Independent check: area of the ring outside the strip |y| ≤ a, by midpoint integration over y. */
function ringAreaOutsideStrip(D: number, t: number, a: number, n = 200_000) {
  const Ro = D / 2;
  const Ri = Ro - t;
  const h = (2 * Ro) / n;
  let sum = 0;
  for (let k = 0; k < n; k++) {
    const y = -Ro + (k + 0.5) * h;
    if (Math.abs(y) <= a) continue;
    const outer = 2 * Math.sqrt(Math.max(0, Ro * Ro - y * y));
    const inner = Math.abs(y) < Ri ? 2 * Math.sqrt(Ri * Ri - y * y) : 0;
    sum += (outer - inner) * h;
  }
  return sum;
}

// CHS 168.3 × 6.3 (SCI P202 handbook row, check-values §4.2: A = 32.1 cm²).
const D = 0.1683;
const t = 0.0063;
const props = chsProperties(D, t);
const member = {
  length: 3,
  area: props.area,
  radiusOfGyration: props.radiusOfGyration,
  E: 210e6,
  fy: 355_000,
  fu: 510_000, // S355, EN 1993-1-1 Table 3.1 (t ≤ 40 mm; from memory)
  effectiveLengthFactor: 1,
  fabrication: "hot-finished" as const,
  outerDiameter: D,
  wallThickness: t,
};

describe("chsNetArea", () => {
  it("matches a direct integration of the cut ring", () => {
    for (const w of [0.02, 0.06, 0.12]) {
      expect(chsNetArea(D, t, w)!).toBeCloseTo(ringAreaOutsideStrip(D, t, w / 2), 7);
    }
  });

  it("is close to A − 2·t·w for a small hole and never removes less than that", () => {
    const w = 0.02;
    const net = chsNetArea(D, t, w)!;
    const lossRatio = (props.area - net) / (2 * t * w);
    expect(lossRatio).toBeGreaterThanOrEqual(1);
    expect(lossRatio).toBeLessThan(1.01);
  });

  it("refuses a hole as wide as the bore", () => {
    expect(chsNetArea(D, t, D - 2 * t)).toBeNull();
  });
});

describe("assessOpening", () => {
  const forces = [
    { combination: "C1", force: 300 },
    { combination: "C2", force: -150 },
  ];

  it("checks tension as the smaller of gross yielding and net rupture (EN 1993-1-1 6.2.3(2)), compression on the net area", () => {
    const a = assessOpening({ standard: "EN1993-1-1", member, opening: { shape: "round", diameter: 0.05, position: 1.5 }, forces });
    const net = chsNetArea(D, t, 0.05)!;
    expect(a.netArea).toBeCloseTo(net, 12);
    const tension = a.combinations[0];
    // 6.2.3(2): Nt,Rd = min(A·fy/γM0, 0.9·Anet·fu/γM2), γM0 = 1.0, γM2 = 1.25 (recommended values)
    const expected = Math.min(props.area * 355_000, (0.9 * net * 510_000) / 1.25);
    expect(tension.check.resistance).toBeCloseTo(expected, 8);
    expect(tension.check.steps.some((s) => s.label.startsWith("Plastic resistance") && String(s.expression).includes("gross"))).toBe(true);
    expect(a.combinations[1].check.mode).toBe("compression");
    expect(a.combinations[1].utilisationWith).toBeGreaterThan(a.combinations[1].utilisationWithout);
    expect(a.verdict).toBe("within capacity on the checks made");
    expect(a.notChecked.join(" ")).toMatch(/local buckling.*stress concentration.*fatigue.*connections/s);
    expect(a.caution).toBe(STANDING_CAUTION);
  });

  it("S460 CHS 88.9 × 4 with a 30 mm hole: rupture governs, net-area yielding would be 18 % unconservative (EN 1993-1-1 6.2.3(2)b)", () => {
    // fy 460, fu 540 MPa: S460N, EN 1993-1-1 Table 3.1 (from memory). Closed form: Nu,Rd / (Anet·fy) = 0.9·fu/(1.25·fy) = 0.7235.
    const small = chsProperties(0.0889, 0.004);
    const tube = { ...member, area: small.area, radiusOfGyration: small.radiusOfGyration, outerDiameter: 0.0889, wallThickness: 0.004, fy: 460_000, fu: 540_000 };
    const a = assessOpening({ standard: "EN1993-1-1", member: tube, opening: { shape: "round", diameter: 0.03, position: 1.5 }, forces: [{ combination: "C1", force: 100 }] });
    const net = chsNetArea(0.0889, 0.004, 0.03)!;
    expect(a.combinations[0].check.resistance).toBeCloseTo((0.9 * net * 540_000) / 1.25, 8);
    expect((net * 460_000) / a.combinations[0].check.resistance).toBeCloseTo(1.183, 3);
    expect(a.combinations[0].check.clause).toMatch(/6\.2\.3\(2\)b/);
  });

  it("AISC D2: yielding on Ag, rupture on Ae = An (U = 1), LRFD φ 0.90 / 0.75", () => {
    const a = assessOpening({ standard: "AISC360-22", member, opening: { shape: "round", diameter: 0.05, position: 1.5 }, forces });
    const net = chsNetArea(D, t, 0.05)!;
    expect(a.combinations[0].check.resistance).toBeCloseTo(Math.min(0.9 * 355_000 * props.area, 0.75 * 510_000 * net), 8);
  });

  it("says over capacity when the net section is overloaded", () => {
    const a = assessOpening({ standard: "AISC360-22", member, opening: { shape: "rectangular", widthAcross: 0.12, lengthAlong: 0.3, position: 1.5 }, forces: [{ combination: "C1", force: 900 }] });
    expect(a.verdict).toBe("over capacity");
    expect(a.governing?.combination).toBe("C1");
  });

  it("says not feasible for an opening off the member or wider than the bore", () => {
    expect(assessOpening({ standard: "AISC360-22", member, opening: { shape: "round", diameter: 0.05, position: 0.01 }, forces }).verdict).toBe("not feasible");
    expect(assessOpening({ standard: "AISC360-22", member, opening: { shape: "round", diameter: 0.16, position: 1.5 }, forces }).verdict).toBe("not feasible");
  });

  it("warns when the opening is near a joint", () => {
    const a = assessOpening({ standard: "AISC360-22", member, opening: { shape: "round", diameter: 0.05, position: 0.15 }, forces });
    expect(a.warnings.some((w) => w.includes("joint"))).toBe(true);
  });
});
