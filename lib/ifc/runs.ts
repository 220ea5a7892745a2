import * as WebIFC from "web-ifc";
import { sectionAxes } from "@/lib/clash/run-geometry";
import { runSchema, type Run, type RunProfile } from "@/lib/mep/schemas";
import { distance, dot, scale, sub, unit, type Vec3 } from "./placement";
import { nameOf, portLinks, propertyValues, relatingOf, typeObjects } from "./relations";
import { text, whereOf, type IfcLine, type IfcProblem, type IfcReader } from "./reader";
import { readSweptAxis } from "./swept";
import { readUnits } from "./units";

/** End points closer than this (m) join two segments into one run. */
export const JOIN_TOLERANCE = 0.01;

/** What an IFC runs import found: the runs (mep-runs/1), every element not read, and what was skipped on purpose. */
export interface IfcRunsResult {
  runs: Run[];
  problems: IfcProblem[];
  skipped: { fittings: number };
  /** The IFC GlobalIds of the segments in each run, in run order. */
  sources: Record<string, string[]>;
}

interface Segment {
  id: number;
  globalId: string;
  name?: string;
  system: string;
  profile: RunProfile;
  insulation: number;
  start: Vec3;
  end: Vec3;
}

const kindWords = new Map<number, string>([
  [WebIFC.IFCDUCTSEGMENT, "duct"],
  [WebIFC.IFCPIPESEGMENT, "pipe"],
  [WebIFC.IFCCABLECARRIERSEGMENT, "cable tray"],
  [WebIFC.IFCDUCTSEGMENTTYPE, "duct"],
  [WebIFC.IFCPIPESEGMENTTYPE, "pipe"],
  [WebIFC.IFCCABLECARRIERSEGMENTTYPE, "cable tray"],
]);
const systemTypes = new Set<number>([WebIFC.IFCSYSTEM, WebIFC.IFCDISTRIBUTIONSYSTEM, WebIFC.IFCDISTRIBUTIONCIRCUIT, WebIFC.IFCBUILDINGSYSTEM]);
const round6 = (v: number) => Math.round(v * 1e6) / 1e6;

/** IFC GlobalIds use `$`, run ids do not; `-` never occurs in a GlobalId, so this mapping is one-to-one. */
export const runIdFromGlobalId = (globalId: string) => globalId.replace(/\$/g, "-");

// Rotation of a rectangle about the run axis, measured like lib/clash/run-geometry.ts: 0 = width horizontal.
function rectangleRotation(xAxis: Vec3, start: Vec3, end: Vec3): number {
  const [w0, h0] = sectionAxes(unit(sub(end, start)), 0);
  const degrees = (Math.atan2(dot(xAxis, h0), dot(xAxis, w0)) * 180) / Math.PI;
  return round6(degrees <= -180 + 1e-9 ? degrees + 360 : degrees);
}

function sameProfile(a: Segment, b: Segment): boolean {
  if (a.system !== b.system || Math.abs(a.insulation - b.insulation) > 1e-6 || a.profile.shape !== b.profile.shape) return false;
  if (a.profile.shape === "round" && b.profile.shape === "round") return Math.abs(a.profile.diameter - b.profile.diameter) < 1e-6;
  if (a.profile.shape === "rectangular" && b.profile.shape === "rectangular") {
    return Math.abs(a.profile.width - b.profile.width) < 1e-6 && Math.abs(a.profile.height - b.profile.height) < 1e-6 && Math.abs(a.profile.rotation - b.profile.rotation) < 0.5;
  }
  return false;
}

function segmentElements(reader: IfcReader): number[] {
  if (reader.schema === "IFC2X3") return reader.idsOf(WebIFC.IFCFLOWSEGMENT);
  return [WebIFC.IFCDUCTSEGMENT, WebIFC.IFCPIPESEGMENT, WebIFC.IFCCABLECARRIERSEGMENT].flatMap((type) => reader.idsOf(type));
}

/** Reads duct, pipe and cable-tray segments of an open IFC model and joins them into runs (m, our format). */
export function readRuns(reader: IfcReader): IfcRunsResult {
  const units = readUnits(reader);
  const problems: IfcProblem[] = [];
  const types = typeObjects(reader);
  const groups = relatingOf(reader, WebIFC.IFCRELASSIGNSTOGROUP, "RelatedObjects", "RelatingGroup");
  const coverings = relatingOf(reader, WebIFC.IFCRELCOVERSBLDGELEMENTS, "RelatedCoverings", "RelatingBuildingElement");
  const definitions = relatingOf(reader, WebIFC.IFCRELDEFINESBYPROPERTIES, "RelatedObjects", "RelatingPropertyDefinition");
  const insulationOf = new Map<number, number>();
  for (const [coveringId, elements] of coverings) {
    const covering = reader.line(coveringId);
    if (text(covering?.PredefinedType) !== "INSULATION") continue;
    const values = propertyValues(reader, definitions, coveringId);
    const thickness = [values.get("NominalThickness"), values.get("Thickness"), values.get("Width")].find((v) => typeof v === "number") as number | undefined;
    if (thickness === undefined) {
      problems.push({ where: whereOf(covering!), message: "insulation covering without NominalThickness, Thickness or Width: insulation not read" });
      continue;
    }
    for (const element of elements) insulationOf.set(element, thickness * units.length);
  }

  const segments: Segment[] = [];
  for (const id of segmentElements(reader)) {
    const line = reader.line(id);
    if (!line) continue;
    const where = whereOf(line);
    const globalId = text(line.GlobalId);
    if (!globalId) {
      problems.push({ where, message: "the segment has no GlobalId" });
      continue;
    }
    const typeLine = (types.get(id) ?? []).map((t) => reader.line(t)).find((t) => t !== undefined);
    const systemLine = (groups.get(id) ?? []).map((g) => reader.line(g)).find((g): g is IfcLine => g !== undefined && systemTypes.has(g.type));
    const system = nameOf(systemLine) ?? nameOf(typeLine) ?? kindWords.get(line.type) ?? (typeLine ? kindWords.get(typeLine.type) : undefined);
    if (!system) {
      problems.push({ where, message: "no distribution system or segment type names the segment's system" });
      continue;
    }
    const axis = readSweptAxis(reader, line);
    if (typeof axis === "string") {
      problems.push({ where, message: axis });
      continue;
    }
    const start = scale(axis.start, units.length);
    const end = scale(axis.end, units.length);
    const p = axis.profile;
    const profile: RunProfile =
      p.kind === "rectangle"
        ? { shape: "rectangular", width: round6(p.xDim * units.length), height: round6(p.yDim * units.length), rotation: rectangleRotation(p.xAxis, start, end) }
        : { shape: "round", diameter: round6(2 * p.radius * units.length) };
    segments.push({ id, globalId, name: text(line.Name), system: system.slice(0, 80), profile, insulation: round6(insulationOf.get(id) ?? 0), start, end });
  }

  const fittings = reader.idsOf(WebIFC.IFCFLOWFITTING).length;
  const runs: Run[] = [];
  const sources: Record<string, string[]> = {};
  for (const chain of chainSegments(segments, portLinks(reader), fittingIds(reader))) {
    const first = chain[0].segment;
    const points: Vec3[] = [];
    for (const { segment, reversed } of chain) {
      for (const p of reversed ? [segment.end, segment.start] : [segment.start, segment.end]) {
        if (points.length === 0 || distance(points[points.length - 1], p) > 1e-6) points.push(p);
      }
    }
    const candidate = {
      id: runIdFromGlobalId(first.globalId),
      name: first.name?.slice(0, 120),
      system: first.system,
      profile: first.profile,
      insulation: first.insulation,
      clearance: 0,
      weightPerMetre: 0,
      points: points.map(([x, y, z]) => ({ x: round6(x), y: round6(y), z: round6(z) })),
    };
    const parsed = runSchema.safeParse(candidate);
    if (!parsed.success) {
      for (const issue of parsed.error.issues) problems.push({ where: first.globalId, message: `${issue.path.join(".") || "run"}: ${issue.message}` });
      continue;
    }
    runs.push(parsed.data);
    sources[parsed.data.id] = chain.map((c) => c.segment.globalId);
  }
  return { runs, problems, skipped: { fittings }, sources };
}

function fittingIds(reader: IfcReader): Set<number> {
  return new Set(reader.idsOf(WebIFC.IFCFLOWFITTING));
}

type End = 0 | 1;
const endPoint = (s: Segment, end: End) => (end === 0 ? s.start : s.end);

/**
 * Joins segments into chains: two segments join when their end points meet (JOIN_TOLERANCE) or their ports connect,
 * directly or through fittings. An end with more than one candidate (a tee) starts new runs instead.
 */
function chainSegments(segments: Segment[], links: [number, number][], fittings: Set<number>): { segment: Segment; reversed: boolean }[][] {
  const index = new Map(segments.map((s, k) => [s.id, k]));
  const pairs = new Set<string>();
  const addPair = (a: number, b: number) => {
    if (a !== b) pairs.add(a < b ? `${a}:${b}` : `${b}:${a}`);
  };
  // Ports: walk from each segment through fittings to the segments beyond them.
  const adjacency = new Map<number, number[]>();
  for (const [a, b] of links) {
    adjacency.set(a, [...(adjacency.get(a) ?? []), b]);
    adjacency.set(b, [...(adjacency.get(b) ?? []), a]);
  }
  for (const s of segments) {
    const seen = new Set([s.id]);
    const queue = [...(adjacency.get(s.id) ?? [])];
    while (queue.length > 0) {
      const next = queue.shift()!;
      if (seen.has(next)) continue;
      seen.add(next);
      if (index.has(next)) addPair(index.get(s.id)!, index.get(next)!);
      else if (fittings.has(next)) queue.push(...(adjacency.get(next) ?? []));
    }
  }
  // End points that meet, found through a grid of JOIN_TOLERANCE cells (neighbouring cells included).
  const cells = new Map<string, number[]>();
  const cellOf = (p: Vec3) => p.map((v) => Math.floor(v / JOIN_TOLERANCE));
  segments.forEach((s, k) => {
    for (const p of [s.start, s.end]) {
      const key = cellOf(p).join(",");
      cells.set(key, [...(cells.get(key) ?? []), k]);
    }
  });
  segments.forEach((s, a) => {
    for (const p of [s.start, s.end]) {
      const [cx, cy, cz] = cellOf(p);
      for (let dx = -1; dx <= 1; dx++) {
        for (let dy = -1; dy <= 1; dy++) {
          for (let dz = -1; dz <= 1; dz++) {
            for (const b of cells.get(`${cx + dx},${cy + dy},${cz + dz}`) ?? []) {
              if (b !== a && (distance(p, segments[b].start) <= JOIN_TOLERANCE || distance(p, segments[b].end) <= JOIN_TOLERANCE)) addPair(a, b);
            }
          }
        }
      }
    }
  });
  // Each pair joins the two nearest ends; an end claimed twice is a branch and joins nothing.
  const claims = new Map<string, { other: number; otherEnd: End }[]>();
  for (const pair of pairs) {
    const [a, b] = pair.split(":").map(Number);
    if (!sameProfile(segments[a], segments[b])) continue;
    let best: [End, End] = [0, 0];
    let bestDistance = Infinity;
    for (const ea of [0, 1] as End[]) {
      for (const eb of [0, 1] as End[]) {
        const d = distance(endPoint(segments[a], ea), endPoint(segments[b], eb));
        if (d < bestDistance) [bestDistance, best] = [d, [ea, eb]];
      }
    }
    claims.set(`${a}:${best[0]}`, [...(claims.get(`${a}:${best[0]}`) ?? []), { other: b, otherEnd: best[1] }]);
    claims.set(`${b}:${best[1]}`, [...(claims.get(`${b}:${best[1]}`) ?? []), { other: a, otherEnd: best[0] }]);
  }
  const joined = (k: number, end: End) => {
    const list = claims.get(`${k}:${end}`);
    if (!list || list.length !== 1) return undefined;
    const back = claims.get(`${list[0].other}:${list[0].otherEnd}`);
    return back && back.length === 1 ? list[0] : undefined;
  };

  const used = new Set<number>();
  const chains: { segment: Segment; reversed: boolean }[][] = [];
  const walk = (startIndex: number, startEnd: End) => {
    const chain: { segment: Segment; reversed: boolean }[] = [];
    let k: number | undefined = startIndex;
    let entry: End = startEnd;
    while (k !== undefined && !used.has(k)) {
      used.add(k);
      chain.push({ segment: segments[k], reversed: entry === 1 });
      const exit: End = entry === 0 ? 1 : 0;
      const next = joined(k, exit);
      k = next?.other;
      entry = next?.otherEnd ?? 0;
    }
    return chain;
  };
  // Open chains start at a free end: of the two free ends, the one whose segment has the smaller GlobalId.
  const order = segments.map((_, k) => k).sort((a, b) => (segments[a].globalId < segments[b].globalId ? -1 : 1));
  for (const k of order) {
    if (used.has(k)) continue;
    const freeEnds = ([0, 1] as End[]).filter((end) => joined(k, end) === undefined);
    if (freeEnds.length === 0) continue;
    chains.push(walk(k, freeEnds[0]));
  }
  // Closed loops: start at the smallest GlobalId.
  for (const k of order) if (!used.has(k)) chains.push(walk(k, 0));
  return chains;
}
