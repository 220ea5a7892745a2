// Grouping of the clash table (issue 16): by run, by system, or by grid zone — the clash's place in plan, in
// squares of ZONE_SIZE metres from the model's origin, so a zone reads the same on every revision and roof. Pure.

export const CLASH_GROUPINGS = ["none", "run", "system", "zone"] as const;
export type ClashGrouping = (typeof CLASH_GROUPINGS)[number];
export const CLASH_GROUPING_LABELS: Record<ClashGrouping, string> = { none: "No grouping", run: "Run", system: "System", zone: "Grid zone" };

/** Side of a grid zone in plan (m): four 3 m modules, a common bay group for coordinating services. */
export const ZONE_SIZE = 12;

/** The grid zone of a point in plan, e.g. "x 12–24 m · y 0–12 m". */
export function gridZone(point: { x: number; y: number }): string {
  const span = (v: number) => {
    const k = Math.floor(v / ZONE_SIZE);
    return `${k * ZONE_SIZE}–${(k + 1) * ZONE_SIZE} m`;
  };
  return `x ${span(point.x)} · y ${span(point.y)}`;
}

type Groupable = { runId: string; system: string | null; point: { x: number; y: number } };

/** The group a clash falls in. */
export function groupKey(row: Groupable, by: Exclude<ClashGrouping, "none">): string {
  if (by === "run") return row.runId;
  if (by === "system") return row.system ?? "no system";
  return gridZone(row.point);
}

/**
 * Rows split into groups in order of first appearance, so the table's sorting decides both the order of the
 * groups and the order within each one.
 */
export function groupRows<T>(rows: T[], key: (row: T) => string): { key: string; rows: T[] }[] {
  const groups = new Map<string, T[]>();
  for (const row of rows) {
    const k = key(row);
    const list = groups.get(k);
    if (list) list.push(row);
    else groups.set(k, [row]);
  }
  return [...groups].map(([k, list]) => ({ key: k, rows: list }));
}
