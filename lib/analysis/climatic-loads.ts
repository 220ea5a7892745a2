// Snow drift at a step and wind pressure zones on the flat top of a generated roof, as nodal loads on the top layer.
// Each node takes the load on its tributary rectangle integrated exactly (the drift varies linearly, the zones are
// piecewise constant), so the total on the roof is the load shape integrated over the plan, with no lumping error.

/** The edges of the roof in plan: west x = 0, east x = spanX, south y = 0, north y = spanY. */
export const ROOF_EDGES = ["west", "east", "south", "north"] as const;
export type RoofEdge = (typeof ROOF_EDGES)[number];

/** The top layer's plan grid: nodes T-i-j at (i·a, j·a), nx by ny bays. */
export interface TopGrid {
  nx: number;
  ny: number;
  a: number;
}

export interface TopLoad {
  node: string;
  fx: number;
  fy: number;
  fz: number;
}

/** Tributary interval of grid line k of n bays of a (half a bay at the edges). */
const tributary = (k: number, n: number, a: number): [number, number] => [Math.max(0, (k - 0.5) * a), Math.min(n * a, (k + 0.5) * a)];

/**
 * A node's tributary interval measured from an edge: `u` across the edge (distance from it), `v` along it, with the
 * roof's depth `d` away from the edge and breadth `b` along it.
 */
function fromEdge(grid: TopGrid, edge: RoofEdge, i: number, j: number) {
  const { nx, ny, a } = grid;
  const x = tributary(i, nx, a);
  const y = tributary(j, ny, a);
  const flip = ([lo, hi]: [number, number], L: number): [number, number] => [L - hi, L - lo];
  switch (edge) {
    case "west":
      return { u: x, v: y, d: nx * a, b: ny * a };
    case "east":
      return { u: flip(x, nx * a), v: y, d: nx * a, b: ny * a };
    case "south":
      return { u: y, v: x, d: ny * a, b: nx * a };
    case "north":
      return { u: flip(y, ny * a), v: x, d: ny * a, b: nx * a };
  }
}

/** The roof's depth away from an edge and breadth along it. */
export function edgeDimensions(grid: TopGrid, edge: RoofEdge): { depth: number; breadth: number } {
  const { d, b } = fromEdge(grid, edge, 0, 0);
  return { depth: d, breadth: b };
}

function eachTopNode(grid: TopGrid, load: (i: number, j: number) => number): TopLoad[] {
  const loads: TopLoad[] = [];
  for (let j = 0; j <= grid.ny; j++) for (let i = 0; i <= grid.nx; i++) loads.push({ node: `T-${i}-${j}`, fx: 0, fy: 0, fz: load(i, j) });
  return loads;
}

// ---------------------------------------------------------------------------------------------------------------
// Snow drift at a step: EN 1991-1-3:2003 5.3.6 "Roofs abutting and close to taller construction works", Figure 5.7.
// Clause values quoted from memory (not in the project's reference sheet): μ1 = 0.8 for the flat lower roof;
// μ2 = μs + μw with μs = 0 when the upper roof is pitched at 15° or less (assumed: a flat roof beside ours);
// μw = (b1 + b2) / (2h) ≤ γh / sk with γ = 2 kN/m3 (snow weight density) and the recommended bounds 0.8 ≤ μw ≤ 4;
// drift length ls = 2h with the recommended bounds 5 m ≤ ls ≤ 15 m; μ falls linearly from μ2 at the step to μ1 at ls.
// ---------------------------------------------------------------------------------------------------------------

/** Snow weight density γ, kN/m3 (EN 1991-1-3 5.3.6(1)). */
export const SNOW_DENSITY = 2;
/** Shape coefficient of the flat lower roof (EN 1991-1-3 Table 5.2, 0° ≤ α ≤ 30°). */
export const FLAT_ROOF_MU1 = 0.8;

export interface SnowDriftShape {
  /** Characteristic ground snow load sk = s / μ1 (Ce = Ct = 1), kN/m2. */
  sk: number;
  mu1: number;
  /** (b1 + b2) / (2h) before the bounds. */
  muwGeometric: number;
  /** γh / sk, the most snow the step's height can hold. */
  muwHeightCap: number;
  muw: number;
  /** μ2 = μs + μw with μs = 0. */
  mu2: number;
  /** Drift length, m. */
  ls: number;
  /** The arithmetic, one line per step. */
  arithmetic: string[];
}

/**
 * The drift shape of EN 1991-1-3 5.3.6 for a step of height h (m) above our roof, with the higher roof b1 wide
 * (m) and ours b2 wide (m) perpendicular to the step; `roofSnow` is the generator's balanced snow s = μ1·sk (kN/m2).
 */
export function snowDriftShape(roofSnow: number, h: number, b1: number, b2: number): SnowDriftShape {
  const sk = roofSnow / FLAT_ROOF_MU1;
  const muwGeometric = (b1 + b2) / (2 * h);
  const muwHeightCap = sk > 0 ? (SNOW_DENSITY * h) / sk : Infinity;
  const muw = Math.min(4, Math.max(0.8, Math.min(muwGeometric, muwHeightCap)));
  const ls = Math.min(15, Math.max(5, 2 * h));
  const f = (x: number) => Number(x.toPrecision(4));
  return {
    sk,
    mu1: FLAT_ROOF_MU1,
    muwGeometric,
    muwHeightCap,
    muw,
    mu2: muw,
    ls,
    arithmetic: [
      `sk = s / μ1 = ${roofSnow} / 0.8 = ${f(sk)} kN/m2 (Ce = Ct = 1)`,
      `μw = (b1 + b2) / 2h = (${b1} + ${b2}) / (2 × ${h}) = ${f(muwGeometric)}; γh / sk = 2 × ${h} / ${f(sk)} = ${f(muwHeightCap)}; bounded to 0.8 … 4: μw = ${f(muw)}`,
      `μ2 = μs + μw = 0 + ${f(muw)} = ${f(muw)} (upper roof pitched at 15° or less)`,
      `ls = 2h = ${f(2 * h)} m, bounded to 5 … 15 m: ls = ${f(ls)} m`,
    ],
  };
}

/** ∫ from u0 to u1 of max(0, 1 − u/ls) du: the drift's triangular part over an interval. */
function triangleIntegral(u0: number, u1: number, ls: number): number {
  const G = (u: number) => (u >= ls ? ls / 2 : u - (u * u) / (2 * ls));
  return G(u1) - G(u0);
}

/** Snow with the drift against `edge` (a higher roof stands along that edge line), as downward top-node loads. */
export function snowDriftLoads(grid: TopGrid, edge: RoofEdge, shape: SnowDriftShape): TopLoad[] {
  return eachTopNode(grid, (i, j) => {
    const { u, v } = fromEdge(grid, edge, i, j);
    const perWidth = shape.mu1 * (u[1] - u[0]) + (shape.mu2 - shape.mu1) * triangleIntegral(u[0], u[1], shape.ls);
    return -shape.sk * perWidth * (v[1] - v[0]);
  });
}

// ---------------------------------------------------------------------------------------------------------------
// Wind on a flat roof: EN 1991-1-4:2005 7.2.3, zones of Figure 7.6 and external pressure coefficients cpe,10 of
// Table 7.2 for sharp eaves (from memory, not in the project's reference sheet): F −1.8, G −1.2, H −0.7, I +0.2 or
// −0.2 (both to be considered). e = min(b, 2h), b the roof's breadth across the wind, h the height of the roof
// above ground. From the windward edge: F (two corners e/4 across, e/10 deep) and G between them, H from e/10 to
// e/2, I beyond. External pressure we = qp(ze)·cpe (5.2(1)); internal pressure is not included.
// ---------------------------------------------------------------------------------------------------------------

export const WIND_ZONE_CPE = { F: -1.8, G: -1.2, H: -0.7 } as const;
/** Zone I: both signs are to be considered (Table 7.2). */
export const WIND_ZONE_I_CPE = { suction: -0.2, pressure: 0.2 } as const;
export type ZoneISign = keyof typeof WIND_ZONE_I_CPE;

/** Zones as rectangles [u0, u1] × [v0, v1] in the wind's frame (u from the windward edge, v across). */
export function windZones(e: number, depth: number, breadth: number, zoneI: ZoneISign) {
  const clipU = (x: number) => Math.min(x, depth);
  const zones = [
    { zone: "F", cpe: WIND_ZONE_CPE.F, u: [0, clipU(e / 10)], v: [0, e / 4] },
    { zone: "F", cpe: WIND_ZONE_CPE.F, u: [0, clipU(e / 10)], v: [breadth - e / 4, breadth] },
    { zone: "G", cpe: WIND_ZONE_CPE.G, u: [0, clipU(e / 10)], v: [e / 4, breadth - e / 4] },
    { zone: "H", cpe: WIND_ZONE_CPE.H, u: [clipU(e / 10), clipU(e / 2)], v: [0, breadth] },
    { zone: "I", cpe: WIND_ZONE_I_CPE[zoneI], u: [clipU(e / 2), depth], v: [0, breadth] },
  ] as const;
  return zones.filter((z) => z.u[1] > z.u[0] && z.v[1] > z.v[0]);
}

const overlap = (a: readonly [number, number] | readonly number[], b: readonly [number, number] | readonly number[]) => Math.max(0, Math.min(a[1], b[1]) - Math.max(a[0], b[0]));

/**
 * Wind from `from` (the windward edge) on a roof `height` m above ground with peak velocity pressure `qp` (kN/m2):
 * top-node loads, upward under suction (fz = −cpe·qp·area).
 */
export function windZoneLoads(grid: TopGrid, from: RoofEdge, qp: number, height: number, zoneI: ZoneISign): TopLoad[] {
  const { depth, breadth } = edgeDimensions(grid, from);
  const zones = windZones(Math.min(breadth, 2 * height), depth, breadth, zoneI);
  return eachTopNode(grid, (i, j) => {
    const { u, v } = fromEdge(grid, from, i, j);
    let fz = 0;
    for (const z of zones) fz -= z.cpe * qp * overlap(u, z.u) * overlap(v, z.v);
    return fz;
  });
}
