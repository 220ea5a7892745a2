import Flatbush from "flatbush";
import type { Run } from "@/lib/mep/schemas";
import { closestSegmentBox, closestSegmentSegment, type Vec3 } from "./distance";
import { clashKey } from "./ids";
import { runSegments, type RunSegment } from "./run-geometry";

/** The part of a truss model (format truss-model/1) that clash detection needs. */
export interface ClashModel {
  nodes: { id: string; x: number; y: number; z: number }[];
  members: { id: string; i: string; j: string; section: string }[];
  sections: { id: string; outerDiameter: number }[];
}

export type ClashKind = "hard" | "clearance";

/** What one detection pass over a revision found (and how many earlier clashes it cleared). */
export type DetectionSummary = { found: number; hard: number; clearance: number; cleared: number };

/** One clash between a member and a run segment. */
export interface Clash {
  /** Stable id (see clashKey). */
  id: string;
  memberId: string;
  runId: string;
  segmentIndex: number;
  /** hard: the bodies (member tube, duct with insulation) overlap; clearance: they are closer than required. */
  kind: ClashKind;
  /** Signed surface-to-surface distance in m (negative = overlap). */
  gap: number;
  /** hard: overlap depth (−gap); clearance: shortfall of clearance (required − gap). m. */
  depth: number;
  requiredClearance: number;
  /** Midway between the two nearest surface points (inside the overlap for a hard clash). */
  point: { x: number; y: number; z: number };
}

// Gaps within a nanometre of a limit count as on the limit: touching bodies are not overlapping.
const TOLERANCE = 1e-9;
// Long run segments are queried in pieces so each query box stays tight around the run (a 40 m diagonal duct
// would otherwise fetch every member under its whole bounding rectangle).
const QUERY_PIECE_LENGTH = 2;

interface MemberTable {
  ids: string[];
  ends: Float64Array; // ax, ay, az, bx, by, bz per member
  radius: Float64Array;
  zMin: Float64Array;
  zMax: Float64Array;
  maxRadius: number;
  index: Flatbush;
}

/**
 * Broad phase: flatbush, a packed static R-tree over the members' plan (x, y) boxes, then a z-interval filter.
 * Roofs are wide and thin, so plan boxes separate members well and a 2D tree is smaller and faster to build than a
 * 3D one; a uniform grid would need a cell size tuned to the module, which varies between roofs.
 */
function indexMembers(model: ClashModel): MemberTable {
  const nodes = new Map(model.nodes.map((n) => [n.id, n]));
  const sections = new Map(model.sections.map((s) => [s.id, s]));
  const count = model.members.length;
  const ends = new Float64Array(count * 6);
  const radius = new Float64Array(count);
  const zMin = new Float64Array(count);
  const zMax = new Float64Array(count);
  const index = new Flatbush(Math.max(count, 1));
  let maxRadius = 0;
  model.members.forEach((m, k) => {
    const a = nodes.get(m.i);
    const b = nodes.get(m.j);
    const section = sections.get(m.section);
    if (!a || !b || !section) throw new Error(`Member ${m.id} refers to a missing node or section.`);
    const r = section.outerDiameter / 2;
    ends.set([a.x, a.y, a.z, b.x, b.y, b.z], k * 6);
    radius[k] = r;
    maxRadius = Math.max(maxRadius, r);
    zMin[k] = Math.min(a.z, b.z) - r;
    zMax[k] = Math.max(a.z, b.z) + r;
    index.add(Math.min(a.x, b.x) - r, Math.min(a.y, b.y) - r, Math.max(a.x, b.x) + r, Math.max(a.y, b.y) + r);
  });
  if (count === 0) index.add(0, 0, 0, 0);
  index.finish();
  return { ids: model.members.map((m) => m.id), ends, radius, zMin, zMax, maxRadius, index };
}

function candidates(table: MemberTable, segment: RunSegment, stamp: Int32Array, mark: number): number[] {
  // The query line: the segment itself, or the box's axis (which includes the bend allowance).
  let a = segment.a;
  let b = segment.b;
  if (segment.box) {
    const { centre, axes, half } = segment.box;
    const u = axes[0];
    a = [centre[0] - u[0] * half[0], centre[1] - u[1] * half[0], centre[2] - u[2] * half[0]];
    b = [centre[0] + u[0] * half[0], centre[1] + u[1] * half[0], centre[2] + u[2] * half[0]];
  }
  const reach = segment.radius + segment.clearance + table.maxRadius + TOLERANCE;
  const pieces = Math.max(1, Math.ceil(Math.hypot(b[0] - a[0], b[1] - a[1]) / QUERY_PIECE_LENGTH));
  const found: number[] = [];
  for (let p = 0; p < pieces; p++) {
    const t0 = p / pieces;
    const t1 = (p + 1) / pieces;
    const x0 = a[0] + (b[0] - a[0]) * t0;
    const x1 = a[0] + (b[0] - a[0]) * t1;
    const y0 = a[1] + (b[1] - a[1]) * t0;
    const y1 = a[1] + (b[1] - a[1]) * t1;
    const z0 = a[2] + (b[2] - a[2]) * t0;
    const z1 = a[2] + (b[2] - a[2]) * t1;
    const zLow = Math.min(z0, z1) - reach;
    const zHigh = Math.max(z0, z1) + reach;
    table.index.search(Math.min(x0, x1) - reach, Math.min(y0, y1) - reach, Math.max(x0, x1) + reach, Math.max(y0, y1) + reach, (k) => {
      if (stamp[k] === mark || table.zMax[k] < zLow || table.zMin[k] > zHigh) return false;
      stamp[k] = mark;
      found.push(k);
      return false;
    });
  }
  return found;
}

function narrowPhase(table: MemberTable, k: number, segment: RunSegment): Clash | null {
  const e = table.ends;
  const p: Vec3 = [e[k * 6], e[k * 6 + 1], e[k * 6 + 2]];
  const q: Vec3 = [e[k * 6 + 3], e[k * 6 + 4], e[k * 6 + 5]];
  const rm = table.radius[k];
  let gap: number;
  let onMember: Vec3;
  let onRun: Vec3;
  let runSurfaceOffset: number;
  if (segment.box) {
    const c = closestSegmentBox(p, q, segment.box);
    gap = c.signedDistance - rm;
    onMember = c.onSegment;
    onRun = c.onBox;
    runSurfaceOffset = 0;
  } else {
    // Round run: exact distance between the two axes; bodies are the member tube and the insulated duct.
    const c = closestSegmentSegment(p, q, segment.a, segment.b);
    gap = c.distance - rm - segment.radius;
    onMember = c.c1;
    onRun = c.c2;
    runSurfaceOffset = segment.radius;
  }
  if (gap >= segment.clearance - TOLERANCE) return null;
  const kind: ClashKind = gap < -TOLERANCE ? "hard" : "clearance";
  const memberId = table.ids[k];
  return {
    id: clashKey(memberId, segment.runId, segment.segmentIndex),
    memberId,
    runId: segment.runId,
    segmentIndex: segment.segmentIndex,
    kind,
    gap,
    depth: kind === "hard" ? -gap : segment.clearance - gap,
    requiredClearance: segment.clearance,
    point: surfaceMidpoint(onMember, rm, onRun, runSurfaceOffset),
  };
}

/** Midway between the member's surface and the run's surface along the line joining the two nearest points. */
function surfaceMidpoint(onMember: Vec3, memberRadius: number, onRun: Vec3, runRadius: number) {
  const d: Vec3 = [onRun[0] - onMember[0], onRun[1] - onMember[1], onRun[2] - onMember[2]];
  const length = Math.hypot(d[0], d[1], d[2]);
  const shift = length > 1e-12 ? (memberRadius + (length - runRadius)) / 2 / length : 0;
  return { x: onMember[0] + d[0] * shift, y: onMember[1] + d[1] * shift, z: onMember[2] + d[2] * shift };
}

/** Finds every clash between the model's members and the runs, ordered by run, segment and member. */
export function detectClashes(model: ClashModel, runs: Run[]): Clash[] {
  const table = indexMembers(model);
  const stamp = new Int32Array(model.members.length).fill(-1);
  const clashes: Clash[] = [];
  let mark = 0;
  for (const run of runs) {
    for (const segment of runSegments(run)) {
      const found = candidates(table, segment, stamp, mark++);
      found.sort((x, y) => x - y);
      for (const k of found) {
        const clash = narrowPhase(table, k, segment);
        if (clash) clashes.push(clash);
      }
    }
  }
  return clashes;
}
