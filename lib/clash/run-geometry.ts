import type { Run } from "@/lib/mep/schemas";
import type { OrientedBox, Vec3 } from "./distance";

const sub = (a: Vec3, b: Vec3): Vec3 => [a[0] - b[0], a[1] - b[1], a[2] - b[2]];
const cross = (a: Vec3, b: Vec3): Vec3 => [a[1] * b[2] - a[2] * b[1], a[2] * b[0] - a[0] * b[2], a[0] * b[1] - a[1] * b[0]];
const norm = (a: Vec3) => Math.hypot(a[0], a[1], a[2]);
const scale = (a: Vec3, k: number): Vec3 => [a[0] * k, a[1] * k, a[2] * k];

/** One straight piece of a run, ready for the narrow phase. */
export interface RunSegment {
  runId: string;
  segmentIndex: number;
  a: Vec3;
  b: Vec3;
  /** Round: the swept radius (duct radius + insulation). Rectangular: the half-diagonal of the insulated section. */
  radius: number;
  /** Present for rectangular profiles: the swept box including insulation (and the bend allowance). */
  box?: OrientedBox;
  clearance: number;
}

/**
 * Section axes of a segment along unit vector u: width axis and height axis. With rotation 0 the width is
 * horizontal (ẑ × u) and the height is u × width, which is vertical for a horizontal run; a vertical riser takes x
 * as its width axis. The rotation turns both about u (right-hand rule).
 */
export function sectionAxes(u: Vec3, rotationDegrees: number): [Vec3, Vec3] {
  const horizontal = cross([0, 0, 1], u);
  const length = norm(horizontal);
  const w0: Vec3 = length > 1e-9 ? scale(horizontal, 1 / length) : [1, 0, 0];
  const h0 = cross(u, w0);
  const theta = (rotationDegrees * Math.PI) / 180;
  const c = Math.cos(theta);
  const s = Math.sin(theta);
  const w: Vec3 = [w0[0] * c + h0[0] * s, w0[1] * c + h0[1] * s, w0[2] * c + h0[2] * s];
  return [w, cross(u, w)];
}

/**
 * Splits runs into segments. Rectangular segments are boxes; at an interior bend each box is lengthened by the
 * larger half-side of its section so the outside corner of the bend stays covered (for bends up to 90° this covers
 * the whole elbow; it over-reaches by at most that half-side on the inside, which errs on the side of reporting).
 */
export function runSegments(run: Run): RunSegment[] {
  const insulation = run.insulation;
  const segments: RunSegment[] = [];
  const last = run.points.length - 2;
  for (let k = 0; k <= last; k++) {
    const a: Vec3 = [run.points[k].x, run.points[k].y, run.points[k].z];
    const b: Vec3 = [run.points[k + 1].x, run.points[k + 1].y, run.points[k + 1].z];
    const base = { runId: run.id, segmentIndex: k, a, b, clearance: run.clearance };
    if (run.profile.shape === "round") {
      // Round runs are capsules: the swept sphere's caps model the elbow at a bend and overstate a free end by r.
      segments.push({ ...base, radius: run.profile.diameter / 2 + insulation });
      continue;
    }
    const d = sub(b, a);
    const length = norm(d);
    const u = scale(d, 1 / length);
    const [w, h] = sectionAxes(u, run.profile.rotation);
    const halfW = run.profile.width / 2 + insulation;
    const halfH = run.profile.height / 2 + insulation;
    const bend = Math.max(halfW, halfH);
    const extendStart = k > 0 ? bend : 0;
    const extendEnd = k < last ? bend : 0;
    const mid = (length + extendEnd - extendStart) / 2;
    segments.push({
      ...base,
      radius: Math.hypot(halfW, halfH),
      box: {
        centre: [a[0] + u[0] * mid, a[1] + u[1] * mid, a[2] + u[2] * mid],
        axes: [u, w, h],
        half: [(length + extendStart + extendEnd) / 2, halfW, halfH],
      },
    });
  }
  return segments;
}
