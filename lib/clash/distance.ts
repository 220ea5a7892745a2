// Narrow-phase distances between a member's axis and a run segment. Own code: the well-known packages for 3D
// collision (e.g. three's math classes) give ray/box and segment/point helpers but no segment–segment closest
// points with parameters, nor a signed segment–box distance; both are short, classical and tested here.

export type Vec3 = [number, number, number];

const sub = (a: Vec3, b: Vec3): Vec3 => [a[0] - b[0], a[1] - b[1], a[2] - b[2]];
const dot = (a: Vec3, b: Vec3) => a[0] * b[0] + a[1] * b[1] + a[2] * b[2];
const clamp01 = (v: number) => (v < 0 ? 0 : v > 1 ? 1 : v);
const lerp = (a: Vec3, b: Vec3, t: number): Vec3 => [a[0] + (b[0] - a[0]) * t, a[1] + (b[1] - a[1]) * t, a[2] + (b[2] - a[2]) * t];

export interface SegmentClosest {
  /** Parameter on the first segment (0 at p1, 1 at q1). */
  s: number;
  /** Parameter on the second segment (0 at p2, 1 at q2). */
  t: number;
  c1: Vec3;
  c2: Vec3;
  distance: number;
}

/**
 * Closest points of two segments [p1,q1] and [p2,q2] (exact, clamped to both segments; the classical method of
 * minimising |c1(s) − c2(t)|² over the unit square, as in Ericson, Real-Time Collision Detection, §5.1.9).
 */
export function closestSegmentSegment(p1: Vec3, q1: Vec3, p2: Vec3, q2: Vec3): SegmentClosest {
  const d1 = sub(q1, p1);
  const d2 = sub(q2, p2);
  const r = sub(p1, p2);
  const a = dot(d1, d1);
  const e = dot(d2, d2);
  const f = dot(d2, r);
  const eps = 1e-18;
  let s: number;
  let t: number;
  if (a <= eps && e <= eps) {
    s = 0;
    t = 0;
  } else if (a <= eps) {
    s = 0;
    t = clamp01(f / e);
  } else {
    const c = dot(d1, r);
    if (e <= eps) {
      t = 0;
      s = clamp01(-c / a);
    } else {
      const b = dot(d1, d2);
      const denom = a * e - b * b;
      // Parallel segments (denom ≈ 0): any s gives the same line distance; start at s = 0 and let the clamping
      // below move t, then s, onto the overlap.
      s = denom > 1e-12 * a * e ? clamp01((b * f - c * e) / denom) : 0;
      t = (b * s + f) / e;
      if (t < 0) {
        t = 0;
        s = clamp01(-c / a);
      } else if (t > 1) {
        t = 1;
        s = clamp01((b - c) / a);
      }
    }
  }
  const c1 = lerp(p1, q1, s);
  const c2 = lerp(p2, q2, t);
  const d = sub(c1, c2);
  return { s, t, c1, c2, distance: Math.sqrt(dot(d, d)) };
}

/** An oriented box: centre, three orthonormal axes and half extents along them. */
export interface OrientedBox {
  centre: Vec3;
  axes: [Vec3, Vec3, Vec3];
  half: Vec3;
}

/** Signed distance from a local point to the box [-h, h] (negative inside: minus the depth to the nearest face). */
function boxSignedDistance(x: number, y: number, z: number, h: Vec3): number {
  const qx = Math.abs(x) - h[0];
  const qy = Math.abs(y) - h[1];
  const qz = Math.abs(z) - h[2];
  const outside = Math.hypot(Math.max(qx, 0), Math.max(qy, 0), Math.max(qz, 0));
  return outside + Math.min(Math.max(qx, qy, qz), 0);
}

export interface SegmentBoxClosest {
  /** Parameter on the segment of the deepest / closest point. */
  t: number;
  /** That point of the segment. */
  onSegment: Vec3;
  /** The nearest point of the box's surface to it (the point itself when inside). */
  onBox: Vec3;
  /** Signed distance of the segment to the box: > 0 apart, < 0 the segment reaches that deep inside. */
  signedDistance: number;
}

const GOLDEN = (Math.sqrt(5) - 1) / 2;
// 0.618^80 ≈ 2e-17: the bracket shrinks below double precision of t, so the minimum is found to rounding.
const GOLDEN_STEPS = 80;

/**
 * Signed distance from segment [p,q] to an oriented box. The signed distance function of a convex body is convex,
 * and so is its restriction to a segment, so a golden-section search over t finds the global minimum (ties keep a
 * minimiser inside the bracket because a convex function is ≥ its value at two points outside them).
 */
export function closestSegmentBox(p: Vec3, q: Vec3, box: OrientedBox): SegmentBoxClosest {
  const [u, v, w] = box.axes;
  const rp = sub(p, box.centre);
  const rq = sub(q, box.centre);
  const lp: Vec3 = [dot(rp, u), dot(rp, v), dot(rp, w)];
  const lq: Vec3 = [dot(rq, u), dot(rq, v), dot(rq, w)];
  const f = (t: number) => boxSignedDistance(lp[0] + (lq[0] - lp[0]) * t, lp[1] + (lq[1] - lp[1]) * t, lp[2] + (lq[2] - lp[2]) * t, box.half);
  let lo = 0;
  let hi = 1;
  let x1 = hi - GOLDEN * (hi - lo);
  let x2 = lo + GOLDEN * (hi - lo);
  let f1 = f(x1);
  let f2 = f(x2);
  for (let k = 0; k < GOLDEN_STEPS; k++) {
    if (f1 <= f2) {
      hi = x2;
      x2 = x1;
      f2 = f1;
      x1 = hi - GOLDEN * (hi - lo);
      f1 = f(x1);
    } else {
      lo = x1;
      x1 = x2;
      f1 = f2;
      x2 = lo + GOLDEN * (hi - lo);
      f2 = f(x2);
    }
  }
  // The ends are candidates too (golden section never evaluates exactly 0 or 1).
  let t = (lo + hi) / 2;
  let best = f(t);
  for (const end of [0, 1]) {
    const value = f(end);
    if (value < best) {
      best = value;
      t = end;
    }
  }
  const local = lerp(lp, lq, t);
  const clamped: Vec3 = [
    Math.min(Math.max(local[0], -box.half[0]), box.half[0]),
    Math.min(Math.max(local[1], -box.half[1]), box.half[1]),
    Math.min(Math.max(local[2], -box.half[2]), box.half[2]),
  ];
  const toWorld = (l: Vec3): Vec3 => [
    box.centre[0] + u[0] * l[0] + v[0] * l[1] + w[0] * l[2],
    box.centre[1] + u[1] * l[0] + v[1] * l[1] + w[1] * l[2],
    box.centre[2] + u[2] * l[0] + v[2] * l[1] + w[2] * l[2],
  ];
  return { t, onSegment: lerp(p, q, t), onBox: toWorld(clamped), signedDistance: best };
}
