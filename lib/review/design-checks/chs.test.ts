import { describe, expect, it } from "vitest";
import { chsProperties } from "./chs";

// Handbook rows: SCI P202 / BS 5950-1 "Circular hollow sections – dimensions and properties" (hot finished,
// BS EN 10210-2), reproduced at https://documents.pub/document/chs-design-tables-55844dedf1e1d.html .
// Values printed to 3 significant figures: A cm², I cm⁴, i cm, Wel cm³, Wpl cm³.
const handbook = [
  { D: 88.9, t: 4.0, A: 10.7, I: 96.3, i: 3.0, Wel: 21.7, Wpl: 28.9 },
  { D: 88.9, t: 3.2, A: 8.62, I: 79.2, i: 3.03, Wel: 17.8, Wpl: 23.5 },
  { D: 114.3, t: 5.0, A: 17.2, I: 257, i: 3.87, Wel: 45.0, Wpl: 59.8 },
  { D: 139.7, t: 5.0, A: 21.2, I: 481, i: 4.77, Wel: 68.8, Wpl: 90.8 },
  { D: 168.3, t: 6.3, A: 32.1, I: 1050, i: 5.73, Wel: 125, Wpl: 165 },
];

const near3sf = (actual: number, printed: number) => expect(Math.abs(actual - printed) / printed).toBeLessThan(0.006);

describe("chsProperties", () => {
  it.each(handbook)("matches the handbook row for $D x $t", (row) => {
    const p = chsProperties(row.D / 10, row.t / 10); // cm in, cm-based properties out
    near3sf(p.area, row.A);
    near3sf(p.secondMoment, row.I);
    near3sf(p.radiusOfGyration, row.i);
    near3sf(p.elasticModulus, row.Wel);
    near3sf(p.plasticModulus, row.Wpl);
  });

  it("gives model-unit values for 88.9 x 4.0 (check-values §4.2: 0.00106688 m², i = 0.030050 m)", () => {
    const p = chsProperties(0.0889, 0.004);
    expect(p.area).toBeCloseTo(0.00106688, 8);
    expect(p.radiusOfGyration).toBeCloseTo(0.03005, 5);
  });

  it("rejects a wall thicker than the radius", () => {
    expect(() => chsProperties(0.05, 0.03)).toThrow(RangeError);
  });
});
