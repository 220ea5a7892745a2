import { describe, expect, it } from "vitest";
import { gridZone, groupKey, groupRows } from "./groups";

describe("clash grouping", () => {
  it("puts a point in its 12 m grid zone, edges belonging to the zone they start", () => {
    expect(gridZone({ x: 0.6, y: 16.5 })).toBe("x 0–12 m · y 12–24 m");
    expect(gridZone({ x: 24, y: 11.99 })).toBe("x 24–36 m · y 0–12 m");
    expect(gridZone({ x: -2, y: 0 })).toBe("x -12–0 m · y 0–12 m");
  });

  it("groups by run, system or zone, keeping the sorted order of groups and rows", () => {
    const rows = [
      { id: 1, runId: "B", system: "heating", point: { x: 1, y: 1 } },
      { id: 2, runId: "A", system: null, point: { x: 13, y: 1 } },
      { id: 3, runId: "B", system: "heating", point: { x: 2, y: 2 } },
    ];
    expect(groupRows(rows, (r) => groupKey(r, "run")).map((g) => [g.key, g.rows.map((r) => r.id)])).toEqual([["B", [1, 3]], ["A", [2]]]);
    expect(groupRows(rows, (r) => groupKey(r, "system")).map((g) => g.key)).toEqual(["heating", "no system"]);
    expect(groupRows(rows, (r) => groupKey(r, "zone")).map((g) => g.rows.length)).toEqual([2, 1]);
  });
});
