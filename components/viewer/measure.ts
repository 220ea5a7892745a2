// Distances and lengths as people read them on the review board: metres to the centimetre.

export type Point3 = readonly [number, number, number];

/** Straight-line distance between two model points (m) and its x, y, z parts. */
export function distanceBetween(a: Point3, b: Point3): { distance: number; dx: number; dy: number; dz: number } {
  const dx = b[0] - a[0];
  const dy = b[1] - a[1];
  const dz = b[2] - a[2];
  return { distance: Math.hypot(dx, dy, dz), dx, dy, dz };
}

/** "12.35 m": two decimals (a centimetre, finer than any steel roof is set out); never "-0.00". */
export function formatMetres(value: number): string {
  const rounded = Math.round(value * 100) / 100;
  return `${(Object.is(rounded, -0) ? 0 : rounded).toFixed(2)} m`;
}
