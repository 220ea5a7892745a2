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

  it("checks tension and compression on the net area and names what it does not check", () => {
    const a = assessOpening({ standard: "EN1993-1-1", member, opening: { shape: "round", diameter: 0.05, position: 1.5 }, forces });
    const net = chsNetArea(D, t, 0.05)!;
    expect(a.netArea).toBeCloseTo(net, 12);
    const tension = a.combinations[0];
    // Net-area yielding: utilisation scales by A/Anet.
    expect(tension.utilisationWith).toBeCloseTo(tension.utilisationWithout * (props.area / net), 10);
    expect(a.combinations[1].check.mode).toBe("compression");
    expect(a.combinations[1].utilisationWith).toBeGreaterThan(a.combinations[1].utilisationWithout);
    expect(a.verdict).toBe("within capacity on the checks made");
    expect(a.notChecked.join(" ")).toMatch(/local buckling.*stress concentration.*fatigue.*connections/s);
    expect(a.caution).toBe(STANDING_CAUTION);
  });

  it("uses net-section rupture when fu is given and it governs (EN 1993-1-1 6.2.3(2)b)", () => {
    const a = assessOpening({ standard: "EN1993-1-1", member: { ...member, fy: 460_000 }, opening: { shape: "round", diameter: 0.05, position: 1.5 }, forces, fu: 540_000 });
    const net = chsNetArea(D, t, 0.05)!;
    expect(a.combinations[0].check.resistance).toBeCloseTo((0.9 * net * 540_000) / 1.25, 8);
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
