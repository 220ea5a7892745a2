import { z } from "zod";
import { generator, physical, text } from "../limits";
import { diagonalBays, diagonalBottomChords, squareOnDiagonalSize } from "./square-on-diagonal";
import { edgeDimensions, ROOF_EDGES, snowDriftLoads, snowDriftShape, windZoneLoads, type ZoneISign } from "./climatic-loads";
import { fabrications, type Combination, type Fabrication, type LoadCase, type TrussMember, type TrussModel, type TrussNode, type TrussSection, type TrussSupport } from "./model";

/** Inputs of the double-layer grid roof generator (m, kN/m2); shared by the web form and the server. */
const pressure = z.number().nonnegative().max(physical.pressure, `Use at most ${physical.pressure} kN/m2.`);
const height = z.number().nonnegative().max(generator.span.max, `Use at most ${generator.span.max} m.`);
const range = ({ min, max }: { min: number; max: number }) => z.number().min(min, `Use at least ${min} m.`).max(max, `Use at most ${max} m.`);

/** The double-layer grid layouts the generator builds (names of the common classification of double-layer grids). */
export const ROOF_PATTERNS = ["square_on_square_offset", "square_on_diagonal"] as const;
export type RoofPattern = (typeof ROOF_PATTERNS)[number];

/** Nodes and members of a grid of nx by ny bays (counted, not built). */
export function roofSize(nx: number, ny: number, pattern: RoofPattern = "square_on_square_offset"): { nodes: number; members: number } {
  if (pattern === "square_on_diagonal") return squareOnDiagonalSize(nx, ny);
  return { nodes: (nx + 1) * (ny + 1) + nx * ny, members: 8 * nx * ny };
}

/** Inputs of the double-layer grid roof generator (m, kN/m2); shared by the web form and the server. */
export const roofParamsSchema = z
  .object({
    name: z.string().min(1).max(text.name).default("Double-layer grid roof"),
    pattern: z.enum(ROOF_PATTERNS).default("square_on_square_offset"),
    spanX: range(generator.span),
    spanY: range(generator.span),
    module: range(generator.module),
    depth: range(generator.depth),
    /** Superimposed dead load on the top layer: deck, insulation, membrane, purlins. */
    roofing: pressure.default(0.6),
    snow: pressure.default(0.8),
    /** Net upward wind pressure on the roof, entered as a positive number. */
    windUplift: pressure.default(0.7),
    /** Services hung from the bottom layer: ducts, pipes, lights, sprinklers. */
    services: pressure.default(0.25),
    /** Roof imposed (maintenance) load on the top layer, 0 for none: EN 1991-1-1 category H, ASCE 7 Lr. */
    imposed: pressure.default(0),
    /**
     * Unbalanced snow as well as balanced: full snow on one half of the span and half on the other, each half in
     * both plan directions (the half-span pattern of EN 1991-1-3 5.3.3 Figure 5.3, cases (ii) and (iii)), so members
     * that work only under unbalanced snow are not called idle.
     */
    unbalancedSnow: z.boolean().default(false),
    /** Maintenance point load (kN, 0 for none) at one top node, T-i-j; the centre of the roof unless told. */
    pointLoad: z.number().nonnegative().max(physical.pressure * 100, `Use at most ${physical.pressure * 100} kN.`).default(0),
    pointLoadNode: z.string().regex(/^T-\d+-\d+$/, "Give a top node as T-i-j (i along x, j along y).").optional(),
    /**
     * Snow drift at a step (EN 1991-1-3 5.3.6): the edge of our roof along which a higher roof stands, "none" for
     * no step; its height above our roof (m) and the higher roof's width away from the step (m, b1).
     */
    snowDriftEdge: z.enum(["none", ...ROOF_EDGES]).default("none"),
    stepHeight: height.default(0),
    upperRoofWidth: height.default(0),
    /**
     * Wind pressure and suction zones F/G/H/I on the flat roof (EN 1991-1-4 7.2.3), wind from each edge, with zone I
     * both in suction and in pressure: the peak velocity pressure qp (kN/m2) and the roof's height above ground (m).
     */
    windZones: z.boolean().default(false),
    windPeakPressure: pressure.default(0),
    roofHeight: height.default(0),
    /** EN 1990 expression (6.10), or the pair (6.10a) and (6.10b) with ξ = 0.85 (Table A1.2(B)). */
    combinationRule: z.enum(["6.10", "6.10a/6.10b"]).default("6.10"),
    /** Which published strength combinations to generate. */
    standard: z.enum(["EN 1990", "ASCE 7-22"]).default("EN 1990"),
    /** How the tubes are made: hot finished (EN 10210) unless told; cold formed (EN 10219, ERW) lowers the checks. */
    fabrication: z.enum(fabrications).default("hot-finished"),
  })
  .superRefine((p, ctx) => {
    for (const key of ["spanX", "spanY"] as const) {
      const bays = p[key] / p.module;
      if (Math.abs(bays - Math.round(bays)) > 1e-6 || Math.round(bays) < 2) {
        ctx.addIssue({ code: "custom", path: [key], message: `span must be a whole number (at least 2) of ${p.module} m modules` });
      }
    }
    if (p.snowDriftEdge !== "none" && !(p.stepHeight > 0)) {
      ctx.addIssue({ code: "custom", path: ["stepHeight"], message: "Give the height of the higher roof above this one (m), or choose no step." });
    }
    // μw = (b1 + b2) / 2h grows with b1: left at 0 it would understate the drift, so it must be given.
    if (p.snowDriftEdge !== "none" && !(p.upperRoofWidth > 0)) {
      ctx.addIssue({ code: "custom", path: ["upperRoofWidth"], message: "Give the width of the higher roof away from the step, b1 (m): the drift grows with it." });
    }
    if (p.windZones && !(p.windPeakPressure > 0)) {
      ctx.addIssue({ code: "custom", path: ["windPeakPressure"], message: "Give the peak velocity pressure qp (kN/m2) for the wind zones." });
    }
    if (p.windZones && !(p.roofHeight > 0)) {
      ctx.addIssue({ code: "custom", path: ["roofHeight"], message: "Give the roof's height above ground (m): the zones' size e = min(b, 2h) depends on it." });
    }
    if (p.standard === "ASCE 7-22") {
      // The shapes are those of EN 1991-1-3 and 1-4; mixing them with ASCE 7 factors would be neither standard.
      if (p.snowDriftEdge !== "none") ctx.addIssue({ code: "custom", path: ["snowDriftEdge"], message: "Snow drift at a step follows EN 1991-1-3: choose the EN 1990 combinations, or no step." });
      if (p.windZones) ctx.addIssue({ code: "custom", path: ["windZones"], message: "Wind zones follow EN 1991-1-4: choose the EN 1990 combinations, or leave the zones off." });
    }
    const node = p.pointLoadNode?.match(/^T-(\d+)-(\d+)$/);
    if (node && (Number(node[1]) > Math.round(p.spanX / p.module) || Number(node[2]) > Math.round(p.spanY / p.module))) {
      ctx.addIssue({ code: "custom", path: ["pointLoadNode"], message: `no top node ${p.pointLoadNode}: i goes to ${Math.round(p.spanX / p.module)}, j to ${Math.round(p.spanY / p.module)}` });
    }
    // Counted before anything is built: a fine module on a long span would otherwise exhaust memory.
    const size = roofSize(Math.round(p.spanX / p.module), Math.round(p.spanY / p.module), p.pattern);
    if (size.nodes > generator.nodes || size.members > generator.members) {
      ctx.addIssue({
        code: "custom",
        path: ["module"],
        message: `This grid would have ${size.nodes.toLocaleString("en")} nodes and ${size.members.toLocaleString("en")} members; the limit is ${generator.nodes.toLocaleString("en")} nodes and ${generator.members.toLocaleString("en")} members. Use a larger module or smaller spans.`,
      });
    }
  });

export type RoofParams = z.input<typeof roofParamsSchema>;

// Steel S355: E 210 GPa (EN 1993-1-1 §3.2.6), fy 355 MPa for t <= 16 mm (EN 10210-1), fu 510 MPa (EN 1993-1-1
// Table 3.1, from memory), unit weight 78.5 kN/m3 (density 7850 kg/m3). E and 78.5 are common practice.
const steel = { id: "S355", E: 210e6, fy: 355e3, fu: 510e3, unitWeight: 78.5 };

/**
 * CHS sizes of EN 10210-2 (hot finished; the same sizes exist cold formed in EN 10219-2). 88.9x4.0, 114.3x5.0, 139.7x5.0 and 168.3x6.3 match the SCI P202
 * handbook table; 76.1x3.2 and 193.7x8.0 are standard sizes listed from memory. Properties from the section
 * formulas A = pi t (D - t), i = sqrt(D^2 + d^2) / 4 (standard geometry).
 */
function chs(outerMm: number, wallMm: number): TrussSection {
  const D = outerMm / 1000;
  const t = wallMm / 1000;
  const d = D - 2 * t;
  return {
    id: `CHS ${outerMm}x${wallMm.toFixed(1)}`,
    material: steel.id,
    area: Math.PI * t * (D - t),
    radiusOfGyration: Math.sqrt(D * D + d * d) / 4,
    outerDiameter: D,
    wallThickness: t,
  };
}

/**
 * Tube sizes by zone: chords carry the bending of the grid, largest at midspan; web members carry its shear,
 * largest next to the supports. Sized so that the demo roof's strength combinations use roughly half to
 * nine tenths of each tube's capacity (checked by the design-check helper).
 */
const sizes = {
  topChordMid: chs(193.7, 8),
  topChordEdge: chs(139.7, 5),
  bottomChordMid: chs(168.3, 6.3),
  bottomChordEdge: chs(114.3, 5),
  diagonalEdge: chs(88.9, 4),
  diagonalMid: chs(76.1, 3.2),
} as const;

/**
 * Generates a double-layer grid roof. Square on square offset: a top layer of square bays, a bottom layer of
 * square bays offset by half a module (bottom nodes at the top bay centres), four web members from each bottom
 * node to the corners of its bay. Square on diagonal: the same top layer, bottom nodes under every other bay
 * (a checkerboard) joined by bottom chords at 45 degrees (see square-on-diagonal.ts). Ids are stable and readable:
 * nodes T-i-j / B-i-j, top chords TCX-i-j / TCY-i-j, bottom chords BCX-i-j / BCY-i-j (offset) or BCD-i-j-NE /
 * BCD-i-j-SE (diagonal), web members D-i-j-SW/SE/NW/NE.
 *
 * Supports: every perimeter top node is held vertically (the roof bears on the walls all round). In plan the
 * square-on-square-offset roof is held by the minimum three restraints, ux + uy at corner T-0-0 and uy at corner T-Nx-0, so it is
 * stable yet free to expand; more horizontal restraints would attract forces from temperature and wall drift.
 *
 * Load cases (characteristic): dead (self-weight plus roofing), services (bottom nodes), snow and wind uplift
 * (top nodes), each by tributary area. Combinations (default; ASCE 7-22 below on request): EN 1990:2002
 * Annex A1, expression (6.10), recommended
 * partial factors of Table A1.2(B): gammaG,sup 1.35, gammaG,inf 1.00, gammaQ 1.50; a variable action that
 * relieves the effect (wind uplift under gravity, snow under uplift) gets factor 0, so psi0 (snow 0.5, wind
 * 0.6, Table A1.1) never enters. Services count as permanent but are left out of the uplift combination: they
 * may be removed or not yet hung, so they are not relied upon to hold the roof down.
 */
export function generateRoof(input: RoofParams): TrussModel {
  const p = roofParamsSchema.parse(input);
  const nx = Math.round(p.spanX / p.module);
  const ny = Math.round(p.spanY / p.module);
  const a = p.module;
  const nodes: TrussNode[] = [];
  const members: TrussMember[] = [];
  const top = (i: number, j: number) => `T-${i}-${j}`;
  const bottom = (i: number, j: number) => `B-${i}-${j}`;
  for (let j = 0; j <= ny; j++) for (let i = 0; i <= nx; i++) nodes.push({ id: top(i, j), x: i * a, y: j * a, z: p.depth });

  // Distance (in modules) of a point from the nearest edge, and from midspan of the short direction.
  const shortSpan = Math.min(p.spanX, p.spanY);
  const edgeDistance = (x: number, y: number) => Math.min(x, p.spanX - x, y, p.spanY - y);
  const chordMid = (x: number, y: number) => edgeDistance(x, y) >= shortSpan / 5;
  const webEdge = (x: number, y: number) => edgeDistance(x, y) <= 2 * a;

  const addMember = (id: string, i: string, j: string, section: TrussSection) => members.push({ id, i, j, section: section.id });
  for (let j = 0; j <= ny; j++) {
    for (let i = 0; i <= nx; i++) {
      if (i < nx) addMember(`TCX-${i}-${j}`, top(i, j), top(i + 1, j), chordMid((i + 0.5) * a, j * a) ? sizes.topChordMid : sizes.topChordEdge);
      if (j < ny) addMember(`TCY-${i}-${j}`, top(i, j), top(i, j + 1), chordMid(i * a, (j + 0.5) * a) ? sizes.topChordMid : sizes.topChordEdge);
    }
  }

  const bottomLoads: { node: string; area: number }[] = [];
  // A bay with a bottom node hangs from the four corners of its top square (web members D-i-j-SW/SE/NW/NE).
  const hangBay = (i: number, j: number, area: number) => {
    const x = (i + 0.5) * a;
    const y = (j + 0.5) * a;
    nodes.push({ id: bottom(i, j), x, y, z: 0 });
    bottomLoads.push({ node: bottom(i, j), area });
    const web = webEdge(x, y) ? sizes.diagonalEdge : sizes.diagonalMid;
    addMember(`D-${i}-${j}-SW`, bottom(i, j), top(i, j), web);
    addMember(`D-${i}-${j}-SE`, bottom(i, j), top(i + 1, j), web);
    addMember(`D-${i}-${j}-NW`, bottom(i, j), top(i, j + 1), web);
    addMember(`D-${i}-${j}-NE`, bottom(i, j), top(i + 1, j + 1), web);
  };
  const bottomChord = (id: string, from: [number, number], to: [number, number]) => {
    const mid = ((from[0] + to[0] + 1) / 2) * a;
    const midY = ((from[1] + to[1] + 1) / 2) * a;
    addMember(id, bottom(...from), bottom(...to), chordMid(mid, midY) ? sizes.bottomChordMid : sizes.bottomChordEdge);
  };
  if (p.pattern === "square_on_diagonal") {
    for (const { i, j, area } of diagonalBays(nx, ny, a)) hangBay(i, j, area);
    for (const { id, from, to } of diagonalBottomChords(nx, ny)) bottomChord(id, from, to);
  } else {
    for (let j = 0; j < ny; j++) for (let i = 0; i < nx; i++) hangBay(i, j, a * a);
    for (let j = 0; j < ny; j++) {
      for (let i = 0; i < nx; i++) {
        if (i < nx - 1) bottomChord(`BCX-${i}-${j}`, [i, j], [i + 1, j]);
        if (j < ny - 1) bottomChord(`BCY-${i}-${j}`, [i, j], [i, j + 1]);
      }
    }
  }

  const supports: TrussSupport[] = [];
  for (let j = 0; j <= ny; j++) {
    for (let i = 0; i <= nx; i++) {
      if (i !== 0 && i !== nx && j !== 0 && j !== ny) continue;
      if (p.pattern === "square_on_diagonal") {
        // Its edge bays rack in plan on three restraints (a mechanism the analysis finds), so every perimeter node is
        // held normal to its edge, as on bearings along walls all round; the roof is then not free to expand.
        supports.push({ node: top(i, j), ux: i === 0 || i === nx, uy: j === 0 || j === ny, uz: true });
      } else {
        supports.push({ node: top(i, j), ux: i === 0 && j === 0, uy: j === 0 && (i === 0 || i === nx), uz: true });
      }
    }
  }

  /** Pressure on the top layer by tributary area; `share` scales it per node (unbalanced patterns). */
  const topLoads = (pressure: number, share: (i: number, j: number) => number = () => 1) => {
    const loads = [];
    for (let j = 0; j <= ny; j++) {
      for (let i = 0; i <= nx; i++) {
        const area = a * a * (i === 0 || i === nx ? 0.5 : 1) * (j === 0 || j === ny ? 0.5 : 1);
        loads.push({ node: top(i, j), fx: 0, fy: 0, fz: pressure * area * share(i, j) });
      }
    }
    return loads;
  };
  // half-span pattern: 1 on the loaded half, 0.5 on the other, 0.75 on the centre line (its tributary area straddles it)
  const half = (k: number, n: number, low: boolean) => (2 * k === n ? 0.75 : 2 * k < n === low ? 1 : 0.5);
  const loadCases: LoadCase[] = [
    { id: "dead", name: `Self-weight and roofing ${p.roofing} kN/m2`, category: "dead", selfWeight: true, nodalLoads: topLoads(-p.roofing) },
    {
      id: "services",
      name: `Hanging services ${p.services} kN/m2`,
      category: "services",
      selfWeight: false,
      nodalLoads: bottomLoads.map(({ node, area }) => ({ node, fx: 0, fy: 0, fz: -p.services * area })),
    },
    { id: "snow", name: `Snow ${p.snow} kN/m2`, category: "snow", selfWeight: false, nodalLoads: topLoads(-p.snow) },
    { id: "wind-uplift", name: `Wind uplift ${p.windUplift} kN/m2`, category: "wind", selfWeight: false, nodalLoads: topLoads(p.windUplift) },
  ];
  const extra: Extra[] = [];
  if (p.unbalancedSnow) {
    const patterns = [
      { id: "snow-west", where: "full on the west half (low x), half on the east", share: (i: number) => half(i, nx, true) },
      { id: "snow-east", where: "full on the east half (high x), half on the west", share: (i: number) => half(i, nx, false) },
      { id: "snow-south", where: "full on the south half (low y), half on the north", share: (_: number, j: number) => half(j, ny, true) },
      { id: "snow-north", where: "full on the north half (high y), half on the south", share: (_: number, j: number) => half(j, ny, false) },
    ];
    for (const pattern of patterns) {
      loadCases.push({ id: pattern.id, name: `Unbalanced snow ${p.snow} kN/m2, ${pattern.where}`, category: "snow", selfWeight: false, nodalLoads: topLoads(-p.snow, pattern.share) });
      extra.push({ id: pattern.id, kind: "snow" });
    }
  }
  const grid = { nx, ny, a };
  if (p.snowDriftEdge !== "none") {
    const edge = p.snowDriftEdge;
    const shape = snowDriftShape(p.snow, p.stepHeight, p.upperRoofWidth, edgeDimensions(grid, edge).depth);
    const name = `Snow drift at a ${p.stepHeight} m step on the ${edge} edge: μ1 0.8, μ2 ${shape.mu2.toFixed(2)}, ls ${shape.ls.toFixed(1)} m (EN 1991-1-3 5.3.6)`;
    loadCases.push({ id: "snow-drift", name, category: "snow", selfWeight: false, nodalLoads: snowDriftLoads(grid, edge, shape) });
    extra.push({ id: "snow-drift", kind: "snow" });
  }
  if (p.windZones) {
    const zoneI: Record<ZoneISign, string> = { suction: "I in suction (−0.2)", pressure: "I in pressure (+0.2)" };
    for (const from of ROOF_EDGES) {
      for (const sign of ["suction", "pressure"] as const) {
        const id = `wind-${from}-${sign === "suction" ? "uplift" : "downward"}`;
        const name = `Wind from the ${from}, qp ${p.windPeakPressure} kN/m2, zones F/G/H/I (EN 1991-1-4 7.2.3), ${zoneI[sign]}`;
        loadCases.push({ id, name, category: "wind", selfWeight: false, nodalLoads: windZoneLoads(grid, from, p.windPeakPressure, p.roofHeight, sign) });
        extra.push({ id, kind: sign === "suction" ? "wind-uplift" : "wind-downward" });
      }
    }
  }
  if (p.imposed > 0) {
    loadCases.push({ id: "imposed", name: `Roof imposed (maintenance) ${p.imposed} kN/m2`, category: "roof_live", selfWeight: false, nodalLoads: topLoads(-p.imposed) });
    extra.push({ id: "imposed", kind: "imposed" });
  }
  if (p.pointLoad > 0) {
    const node = p.pointLoadNode ?? top(Math.round(nx / 2), Math.round(ny / 2));
    loadCases.push({ id: "point", name: `Maintenance point load ${p.pointLoad} kN at ${node}`, category: "roof_live", selfWeight: false, nodalLoads: [{ node, fx: 0, fy: 0, fz: -p.pointLoad }] });
    extra.push({ id: "point", kind: "imposed" });
  }
  const combinations = p.standard === "ASCE 7-22" ? asce722Combinations(extra) : en1990Combinations(p.combinationRule, extra);

  const usedSections = new Set(members.map((m) => m.section));
  return {
    format: "truss-model/1",
    name: p.name,
    materials: [steel],
    sections: Object.values(sizes)
      .filter((s, k, all) => usedSections.has(s.id) && all.findIndex((o) => o.id === s.id) === k)
      .map((s): TrussSection => ({ ...s, fabrication: p.fabrication satisfies Fabrication })),
    nodes,
    members,
    supports,
    loadCases,
    combinations,
  };
}

/** A generated load case beyond dead, services, balanced snow and uniform uplift, by how it combines. */
type Extra = { id: string; kind: "snow" | "imposed" | "wind-uplift" | "wind-downward" };

/**
 * EN 1990 Annex A1 with the recommended values of Table A1.2(B): γG,sup 1.35, γG,inf 1.00, γQ 1.50, ξ 0.85; ψ0 of
 * Table A1.1: snow 0.5 (sites below 1000 m), wind 0.6, roof imposed (category H) 0. Roof imposed load is not combined
 * with snow or wind (EN 1991-1-1 3.3.2(1)), so each gravity variable action leads alone; wind uplift relieves
 * gravity and snow relieves uplift, so neither accompanies the other. (6.10a) with snow only accompanying is
 * 1.35G + 0.75S, (6.10b) with snow leading 1.15G + 1.5S. A wind zone case with zone I in suction is an uplift case
 * (1.0G + 1.5W, services not relied upon); with zone I in pressure it leads with snow accompanying:
 * 1.35G + 1.5W + 0.75S under (6.10), or (6.10a) 1.35G + 0.9W + 0.75S and (6.10b) 1.15G + 1.5W + 0.75S.
 */
function en1990Combinations(rule: "6.10" | "6.10a/6.10b", extra: Extra[]): Combination[] {
  const G = (factor: number) => ({ dead: factor, services: factor });
  const uplift: Combination = { id: "ULS-3", name: "EN 1990 (6.10) wind uplift leading, G favourable: 1.0G + 1.5W", factors: { dead: 1.0, "wind-uplift": 1.5 }, kind: "ultimate" };
  const sls: Combination = { id: "SLS-1", name: "EN 1990 (6.14b) characteristic, snow leading: G + S", factors: { dead: 1.0, services: 1.0, snow: 1.0 }, kind: "serviceability" };
  const wind = ({ id, kind }: Extra): Combination[] => {
    if (kind === "wind-uplift") return [{ id: `ULS-${id}`, name: `EN 1990 (6.10) ${id} leading, G favourable: 1.0G + 1.5W`, factors: { dead: 1.0, [id]: 1.5 }, kind: "ultimate" }];
    if (rule === "6.10") return [{ id: `ULS-${id}`, name: `EN 1990 (6.10) ${id} leading, snow accompanying: 1.35G + 1.5W + 1.5·0.5S`, factors: { ...G(1.35), [id]: 1.5, snow: 0.75 }, kind: "ultimate" }];
    return [
      { id: `ULS-${id}-a`, name: `EN 1990 (6.10a) ${id} and snow accompanying: 1.35G + 1.5·0.6W + 1.5·0.5S`, factors: { ...G(1.35), [id]: 0.9, snow: 0.75 }, kind: "ultimate" },
      { id: `ULS-${id}-b`, name: `EN 1990 (6.10b) ${id} leading, snow accompanying: 0.85·1.35G + 1.5W + 1.5·0.5S`, factors: { ...G(1.1475), [id]: 1.5, snow: 0.75 }, kind: "ultimate" },
    ];
  };
  const isWind = (e: Extra) => e.kind === "wind-uplift" || e.kind === "wind-downward";
  const gravity = extra.filter((e) => !isWind(e));
  const winds = extra.filter(isWind).flatMap(wind);
  if (rule === "6.10") {
    return [
      { id: "ULS-1", name: "EN 1990 (6.10) permanent only: 1.35G", factors: G(1.35), kind: "ultimate" },
      { id: "ULS-2", name: "EN 1990 (6.10) snow leading: 1.35G + 1.5S", factors: { ...G(1.35), snow: 1.5 }, kind: "ultimate" },
      uplift,
      sls,
      ...gravity.map(({ id }): Combination => ({ id: `ULS-${id}`, name: `EN 1990 (6.10) ${id} leading: 1.35G + 1.5Q`, factors: { ...G(1.35), [id]: 1.5 }, kind: "ultimate" })),
      ...winds,
    ];
  }
  return [
    { id: "ULS-1", name: "EN 1990 (6.10a) permanent only: 1.35G", factors: G(1.35), kind: "ultimate" },
    ...[{ id: "snow", kind: "snow" as const }, ...gravity].flatMap(({ id, kind }): Combination[] =>
      kind === "snow"
        ? [
            { id: `ULS-${id}-a`, name: `EN 1990 (6.10a) ${id} accompanying: 1.35G + 1.5·0.5S`, factors: { ...G(1.35), [id]: 0.75 }, kind: "ultimate" },
            { id: `ULS-${id}-b`, name: `EN 1990 (6.10b) ${id} leading: 0.85·1.35G + 1.5S`, factors: { ...G(1.1475), [id]: 1.5 }, kind: "ultimate" },
          ]
        : // ψ0 = 0 for roof imposed load: (6.10a) is then the permanent-only combination above
          [{ id: `ULS-${id}-b`, name: `EN 1990 (6.10b) ${id} leading: 0.85·1.35G + 1.5Q`, factors: { ...G(1.1475), [id]: 1.5 }, kind: "ultimate" }],
    ),
    uplift,
    sls,
    ...winds,
  ];
}

/**
 * ASCE/SEI 7-22 §2.3.1 strength combinations for a roof with D, S (strength-level, factor 1.0 when leading)
 * and W: 1.4D; 1.2D + 1.0S (the companion 0.5W is uplift here, which relieves, so it is left out); 0.9D + 1.0W
 * for uplift. Services are dead load but, as above, not relied upon against uplift. Roof live load: 1.2D + 1.6Lr.
 */
function asce722Combinations(extra: Extra[]): Combination[] {
  return [
    { id: "LRFD-1", name: "ASCE 7-22 2.3.1: 1.4D", factors: { dead: 1.4, services: 1.4 }, kind: "ultimate" },
    { id: "LRFD-2", name: "ASCE 7-22 2.3.1: 1.2D + 1.0S", factors: { dead: 1.2, services: 1.2, snow: 1.0 }, kind: "ultimate" },
    { id: "LRFD-3", name: "ASCE 7-22 2.3.1: 0.9D + 1.0W (uplift)", factors: { dead: 0.9, "wind-uplift": 1.0 }, kind: "ultimate" },
    ...extra.map(({ id, kind }): Combination => {
      if (kind === "snow") return { id: `LRFD-${id}`, name: `ASCE 7-22 2.3.1: 1.2D + 1.0S (${id})`, factors: { dead: 1.2, services: 1.2, [id]: 1.0 }, kind: "ultimate" };
      if (kind === "imposed") return { id: `LRFD-${id}`, name: `ASCE 7-22 2.3.1: 1.2D + 1.6Lr (${id})`, factors: { dead: 1.2, services: 1.2, [id]: 1.6 }, kind: "ultimate" };
      // roofParamsSchema refuses wind zones with ASCE 7-22 (their shapes are EN 1991-1-4's)
      throw new Error(`load case ${id} has no ASCE 7-22 combination`);
    }),
  ];
}

