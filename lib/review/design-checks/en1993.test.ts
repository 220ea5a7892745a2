import { describe, expect, it } from "vitest";
import { chsBucklingCurve, enCompression, enTension, reductionFactor, type BucklingCurve } from "./en1993";
import type { MemberDesignInput } from "./types";

describe("EN 1993-1-1 6.3.1.2 reduction factor", () => {
  // χ from 6.49 with α of Table 6.1, computed in check-values §3.2 (formula confirmed from the EN 1993-1-1:2005
  // text reproduced at https://vi.scribd.com/document/189571358/Bucking-Curves-EN-1993-1-1 ); the λ̄ = 1.0 row
  // matches ENV 1993-1-1 Table 5.5.2 (from memory).
  const table: Record<BucklingCurve, number[]> = {
    a0: [0.9513, 0.7253, 0.3953, 0.2323],
    a: [0.9243, 0.6656, 0.3724, 0.2229],
    b: [0.8842, 0.597, 0.3422, 0.2095],
    c: [0.843, 0.5399, 0.3145, 0.1962],
    d: [0.7793, 0.4671, 0.2766, 0.1766],
  };
  for (const [curve, values] of Object.entries(table) as [BucklingCurve, number[]][]) {
    it.each([0.5, 1.0, 1.5, 2.0].map((lambda, k) => [lambda, values[k]]))(`curve ${curve}: λ̄ %d → χ %d`, (lambda, chi) => {
      expect(reductionFactor(lambda, curve).chi).toBeCloseTo(chi, 4);
    });
  }

  it("is 1.0 on the plateau λ̄ ≤ 0.2", () => {
    expect(reductionFactor(0.2, "c").chi).toBe(1);
  });

  it("picks the hollow-section curve of Table 6.2: hot finished a (a0 for S460), cold formed c", () => {
    expect(chsBucklingCurve("hot-finished", 355_000)).toBe("a");
    expect(chsBucklingCurve("hot-finished", 460_000)).toBe("a0");
    expect(chsBucklingCurve("cold-formed", 460_000)).toBe("c");
  });
});

describe("EN 1993-1-1 member checks in model units", () => {
  // SCI/ArcelorMittal "Steel Buildings in Europe", Multi-Storey Part 4, Worked Example A.5
  // (https://infosteel.eu/images/Steel-Buildings-in-Europe/MSB04/105): HE 300 B, S235, A = 149 cm²,
  // Iy = 25170 cm⁴, Lcr,y = 8.00 m, curve b → Ncr,y = 8151.2 kN, λ̄y = 0.655, Φy = 0.792, χy = 0.808.
  const area = 149e-4;
  const input: MemberDesignInput = {
    length: 8,
    area,
    radiusOfGyration: Math.sqrt(25170e-8 / area),
    E: 210e6,
    fy: 235_000,
    fu: 360_000,
    effectiveLengthFactor: 1,
    fabrication: "hot-finished",
  };
  const value = (steps: { label: string; value: number | string }[], start: string) => steps.find((s) => s.label.startsWith(start))?.value;

  it("reproduces Worked Example A.5 about y-y", () => {
    const check = enCompression(input, -2000, "b");
    expect(value(check.steps, "Elastic critical force") as number).toBeCloseTo(8151.2, 0);
    expect(value(check.steps, "Non-dimensional") as number).toBeCloseTo(0.655, 3);
    expect(value(check.steps, "Φ") as number).toBeCloseTo(0.792, 3);
    expect(value(check.steps, "Reduction factor") as number).toBeCloseTo(0.808, 3);
    expect(check.resistance).toBeCloseTo(0.8085 * area * 235_000, -1);
  });

  it("ignores buckling when NEd/Ncr ≤ 0.04 (6.3.1.2(4)) and uses A·fy/γM0", () => {
    const check = enCompression(input, -0.04 * 8151, "b");
    expect(check.resistance).toBeCloseTo(area * 235_000, 6);
  });

  it("checks tension as A·fy/γM0 and warns above the common-practice slenderness", () => {
    const check = enTension(input, 100);
    expect(check.resistance).toBeCloseTo(area * 235_000, 6);
    expect(check.utilisation).toBeCloseTo(100 / (area * 235_000), 12);
    const long = enTension({ ...input, length: 351 * input.radiusOfGyration }, 1);
    expect(long.warnings[0]).toMatch(/350/);
  });

  it("cold-formed (EN 10219) tubes take curve c, hot-finished curve a: at λ̄ = 1.0, χ 0.5399 against 0.6656 (check-values §3.2), 23 % apart", () => {
    // λ̄ = 1 when Lcr = π·i·√(E/fy) (6.50 with Ncr = π²EI/Lcr²); S355, E 210 GPa, CHS 88.9 × 4.0 (i = 30.05 mm).
    const tube = { ...input, area: 0.00106688, radiusOfGyration: 0.03005, fy: 355_000, fu: 510_000 };
    const length = Math.PI * tube.radiusOfGyration * Math.sqrt(tube.E / tube.fy);
    const cold = enCompression({ ...tube, length, fabrication: "cold-formed" }, -100);
    const hot = enCompression({ ...tube, length, fabrication: "hot-finished" }, -100);
    expect(cold.resistance).toBeCloseTo(0.5399 * tube.area * 355_000, 1);
    expect(hot.resistance).toBeCloseTo(0.6656 * tube.area * 355_000, 1);
    expect(hot.resistance / cold.resistance).toBeCloseTo(1.233, 3);
    expect(cold.steps.find((s) => s.label === "Fabrication")?.value).toBe("cold-formed");
  });

  it("a member without holes is checked in tension on the gross area only; with a net area also 0.9·Anet·fu/γM2 (6.2.3(2))", () => {
    expect(enTension(input, 10).steps.some((s) => s.label.startsWith("Net-section"))).toBe(false);
    const holed = enTension({ ...input, netArea: 0.9 * area }, 10);
    expect(holed.resistance).toBeCloseTo(Math.min(area * 235_000, (0.9 * 0.9 * area * 360_000) / 1.25), 6);
  });
});
