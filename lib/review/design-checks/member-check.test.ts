import { describe, expect, it } from "vitest";
import { axialUtilisation, checkAxialForce, resistanceTable, tableUtilisation } from "./member-check";
import type { DesignStandard, MemberDesignInput } from "./types";

// Tubes of check-values §4.2 (SCI P202 rows) at lengths from stocky to slender, S355, E = 210 GPa.
const tubes = [
  { area: 0.00106688, radiusOfGyration: 0.03005 },
  { area: 0.0017169, radiusOfGyration: 0.038684 },
  { area: 0.0032063, radiusOfGyration: 0.057319 },
];
const hot: MemberDesignInput[] = tubes.flatMap((t) =>
  [0.2, 1, 3, 6, 12].map((length) => ({ ...t, length, E: 210e6, fy: 355e3, fu: 510e3, effectiveLengthFactor: 1, fabrication: "hot-finished" as const })),
);
// the same tubes cold formed (EN curve c, AISC design wall 0.93·t), in ASD, and with a hole (net area 85 %)
const inputs: MemberDesignInput[] = [
  ...hot,
  ...hot.map((i) => ({ ...i, fabrication: "cold-formed" as const, outerDiameter: 0.0889, wallThickness: 0.004 })),
  ...hot.map((i) => ({ ...i, method: "ASD" as const })),
  ...hot.map((i) => ({ ...i, netArea: 0.85 * i.area })),
];

describe("resistance table", () => {
  it.each(["AISC360-22", "EN1993-1-1"] as DesignStandard[])("gives the same utilisation as the full %s check", (standard) => {
    const table = resistanceTable(standard, inputs);
    inputs.forEach((input, e) => {
      for (const force of [250, 3, 0, -0.5, -5, -40, -400]) {
        const full = checkAxialForce(standard, input, force).utilisation;
        expect(tableUtilisation(table, e, force)).toBeCloseTo(full, 12);
        expect(axialUtilisation(standard, input, force)).toBeCloseTo(full, 12);
      }
    });
  });
});
