// Hanging services: a duct or pipe run's weight, hung at a hanger spacing, as nodal loads on the bottom layer.
import Flatbush from "flatbush";
import { classifyMembers, loadVectorForCase, zeroForceMask, type LoadCase, type TrussModel } from "@/lib/analysis";
import type { ReviewContext } from "./context";

/** A run as the MEP side describes it: polyline in model coordinates (m), weight in kN/m. */
export type ServiceRun = { id: string; points: { x: number; y: number; z: number }[]; weightPerMetre: number };

export type Hanger = { run: string; x: number; y: number; z: number; node: string; load: number };

export type ServicesLoad = { loadCase: LoadCase; hangers: Hanger[]; totalLoad: number };

export type ServicesLoadOptions = {
  /** Largest distance between hangers along a run, m. */
  hangerSpacing: number;
  id?: string;
  name?: string;
};

/** Nodes of the bottom layer (ends of bottom-chord members); every node when the model has none. */
function bottomLayerNodes(model: TrussModel) {
  const classes = classifyMembers(model);
  const ids = new Set<string>();
  for (const m of model.members) if (classes[m.id] === "bottom_chord") ids.add(m.i).add(m.j);
  return ids.size > 0 ? model.nodes.filter((n) => ids.has(n.id)) : model.nodes;
}

/**
 * Places hangers along each run, evenly at no more than the given spacing, one at each end; each carries its
 * tributary length × weight per metre (ends half a bay), so the run's whole weight is hung. Each hanger's load
 * goes down on the bottom-layer node nearest to it in plan (a hanger drops vertically from the grid).
 * Returns a load case of category "services" to add to the model, and the hanger list behind it.
 */
export function servicesLoadCase(model: TrussModel, runs: ServiceRun[], options: ServicesLoadOptions): ServicesLoad {
  if (!(options.hangerSpacing > 0)) throw new RangeError("hanger spacing must be positive");
  const bottom = bottomLayerNodes(model);
  const index = new Flatbush(Math.max(bottom.length, 1));
  for (const n of bottom) index.add(n.x, n.y);
  index.finish();

  const hangers: Hanger[] = [];
  for (const run of runs) {
    const segments = run.points.slice(1).map((p, k) => {
      const a = run.points[k];
      return { a, b: p, length: Math.hypot(p.x - a.x, p.y - a.y, p.z - a.z) };
    });
    const total = segments.reduce((s, g) => s + g.length, 0);
    if (run.points.length < 2 || total === 0) throw new RangeError(`run "${run.id}" needs at least two distinct points`);
    const bays = Math.ceil(total / options.hangerSpacing - 1e-9);
    const bay = total / bays;
    for (let k = 0; k <= bays; k++) {
      const at = pointAt(segments, k * bay);
      const node = bottom[index.neighbors(at.x, at.y, 1)[0]];
      const share = k === 0 || k === bays ? bay / 2 : bay;
      hangers.push({ run: run.id, ...at, node: node.id, load: share * run.weightPerMetre });
    }
  }

  const byNode = new Map<string, number>();
  for (const h of hangers) byNode.set(h.node, (byNode.get(h.node) ?? 0) + h.load);
  const totalLoad = hangers.reduce((s, h) => s + h.load, 0);
  return {
    loadCase: {
      id: options.id ?? "services-runs",
      name: options.name ?? `Hung services (${runs.length} run${runs.length === 1 ? "" : "s"}, hangers at ≤ ${options.hangerSpacing} m)`,
      category: "services",
      selfWeight: false,
      nodalLoads: [...byNode].map(([node, load]) => ({ node, fx: 0, fy: 0, fz: -load })),
    },
    hangers,
    totalLoad,
  };
}

function pointAt(segments: { a: { x: number; y: number; z: number }; b: { x: number; y: number; z: number }; length: number }[], distance: number) {
  let left = distance;
  for (const s of segments) {
    if (left <= s.length || s === segments[segments.length - 1]) {
      const t = s.length === 0 ? 0 : Math.min(1, left / s.length);
      return { x: s.a.x + t * (s.b.x - s.a.x), y: s.a.y + t * (s.b.y - s.a.y), z: s.a.z + t * (s.b.z - s.a.z) };
    }
    left -= s.length;
  }
  throw new Error("empty run");
}

export type ServicesComparison = ServicesLoad & {
  /** Zero-force members of the services case on its own. */
  zeroUnderServices: string[];
  /** Per existing result: how its zero-force set changes when the services case is added with `factor`. */
  results: { result: string; noLongerZero: string[]; newlyZero: string[] }[];
  factor: number;
};

/** Adds the hung-services case to every result (times `factor`, 1.0 unless told) and compares zero-force sets. */
export function compareServicesLoad(context: ReviewContext, runs: ServiceRun[], options: ServicesLoadOptions & { factor?: number }): ServicesComparison {
  const load = servicesLoadCase(context.model, runs, options);
  const factor = options.factor ?? 1;
  const withCase: TrussModel = { ...context.model, loadCases: [...context.model.loadCases, load.loadCase] };
  const { structure, model } = context;
  const services = structure.memberForces(structure.solve(loadVectorForCase(withCase, load.loadCase.id, structure.topology)));
  const ids = (mask: Uint8Array) => model.members.filter((_, e) => mask[e]).map((m) => m.id);
  const results = [...context.forces].map(([result, forces]) => {
    const before = zeroForceMask(forces);
    const after = zeroForceMask(forces.map((n, e) => n + factor * services[e]));
    return {
      result,
      noLongerZero: ids(before.map((z, e) => (z && !after[e] ? 1 : 0))),
      newlyZero: ids(after.map((z, e) => (z && !before[e] ? 1 : 0))),
    };
  });
  return { ...load, zeroUnderServices: ids(zeroForceMask(services)), results, factor };
}
