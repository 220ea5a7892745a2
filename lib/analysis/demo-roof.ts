import { generateRoof } from "./generator";
import type { NodalLoad, TrussModel } from "./model";

/**
 * The demo project's roof: our invented Northfield Community Sports Hall, 36 m x 48 m on 3 m modules, with the
 * bearings and wind of its own site so that the product's central question can be seen in it:
 *
 * - The west gable is the concrete changing-room block. Its ring beam holds the roof's west edge down and along the
 *   wall (uy, uz at every west top node); the other walls carry the roof on sliding bearings (uz only). The west
 *   edge chords TCY-0-* therefore join two points that cannot move along them: zero in every combination, whatever
 *   the load (common practice: a member between two bearings held in its own direction carries nothing).
 * - Across the wall (x) the roof is held only by two bottom-layer restraint struts RS-W1 and RS-W2 to anchors on
 *   that wall. Plan equilibrium fixes both strut forces (ΣFx and ΣMz about the west wall, whose y restraints give
 *   no moment there), so under the vertical gravity combinations they carry exactly nothing; under the wind from
 *   the west, whose wall pressures reach the roof at the eaves, they carry all of it.
 * - Every other member works in every combination.
 *
 * Wind on the walls (EN 1991-1-4 §7.2.2 Table 7.1, h/d = 9/48 <= 0.25, from memory: zone D cpe,10 +0.7 windward,
 * zone E -0.3 leeward), on an invented peak velocity pressure of 0.75 kN/m2; the walls (9 m) span from floor to
 * roof, so half of each wall's wind reaches the eaves: 4.5 m x 0.75 x cpe per metre of eaves.
 */
export function demoRoof(): TrussModel {
  // Depth 1.8 m = short span / 20, the deep end of the common span/20 to span/30 range for perimeter support.
  const bay = 3;
  const base = generateRoof({
    name: "Northfield Community Sports Hall roof",
    spanX: 48,
    spanY: 36,
    module: bay,
    depth: 1.8,
    roofing: 0.6,
    snow: 0.8,
    windUplift: 0.9,
    services: 0.25,
  });
  const nx = 48 / bay;
  const ny = 36 / bay;
  const westEdge = (node: string) => /^T-0-\d+$/.test(node);
  const supports = base.supports.map((s) => (westEdge(s.node) ? { node: s.node, ux: false, uy: true, uz: true } : { node: s.node, ux: false, uy: false, uz: true }));

  // Restraint struts from the bottom layer's first row to anchors on the west wall, symmetric about mid-length.
  const strutRows = [2, ny - 3];
  const anchors = strutRows.map((j, k) => ({ id: `W-${k + 1}`, x: 0, y: (j + 0.5) * bay, z: 0 }));
  const struts = strutRows.map((j, k) => ({ id: `RS-W${k + 1}`, i: `B-0-${j}`, j: anchors[k].id, section: "CHS 114.3x5.0" }));

  const qp = 0.75;
  const eaves = 4.5;
  const perMetre = { west: 0.7 * qp * eaves, east: 0.3 * qp * eaves };
  const eavesLoads: NodalLoad[] = [];
  for (let j = 0; j <= ny; j++) {
    const length = bay * (j === 0 || j === ny ? 0.5 : 1);
    // Pressure on the west wall pushes east; suction on the east wall pulls east too.
    eavesLoads.push({ node: `T-0-${j}`, fx: perMetre.west * length, fy: 0, fz: 0 });
    eavesLoads.push({ node: `T-${nx}-${j}`, fx: perMetre.east * length, fy: 0, fz: 0 });
  }
  const loadCases = base.loadCases.map((c) =>
    c.id === "wind-uplift"
      ? { ...c, name: `Wind from the west: ${c.name.replace(/^Wind uplift /, "uplift ")} on the roof, wall pressure at the eaves`, nodalLoads: [...c.nodalLoads, ...eavesLoads] }
      : c,
  );
  return {
    ...base,
    nodes: [...base.nodes, ...anchors],
    members: [...base.members, ...struts],
    supports: [...supports, ...anchors.map((a) => ({ node: a.id, ux: true, uy: true, uz: true }))],
    loadCases,
  };
}
