// Screen-space picking of members and nodes (issue 17 item 1). Raycasting instanced cylinders misses thin members
// and, from r3f's "nearest hit", picked whatever lay behind an empty pixel; here every visible member segment and
// node is projected to screen pixels and the nearest one within a pixel tolerance wins, nodes before members.
// Pure (no three.js objects): the caller passes the camera's view-projection matrix (three's Matrix4.elements,
// column-major), the viewport size in CSS pixels and the pointer position relative to the canvas.
//
// Written here rather than taken from a package: three's Raycaster works in world units (a world-unit threshold
// grows with distance) and has no "nearest segment in pixels" query; the maths is a few lines.

export type Vec3 = [number, number, number];

/** What can be picked: node positions [x0, y0, z0, x1, …] and member ends [i0, j0, i1, j1, …] (node indices). */
export interface PickScene {
  positions: Float32Array;
  ends: Int32Array;
  /** 1 for each member drawn now (filters, section box); all members when absent. */
  memberMask?: Uint8Array | null;
  /** 1 for each node drawn now (section box); all nodes when absent. */
  nodeMask?: Uint8Array | null;
}

export interface Viewport { width: number; height: number }
export interface ScreenPoint { x: number; y: number }

export type PickHit =
  | { kind: "node"; index: number; point: Vec3; distancePx: number }
  /** `t` runs from the member's first node (0) to its second (1); `point` is that point in model coordinates. */
  | { kind: "member"; index: number; point: Vec3; t: number; distancePx: number };

/** Default pointer tolerance in CSS pixels: a member drawn 1 px wide is still easy to hit. */
export const PICK_TOLERANCE_PX = 6;
/** Candidates closer on screen than this to the best one are taken as overlapping; the nearest to the camera wins. */
const OVERLAP_PX = 1;
/** Clip-space w below which a point counts as behind the camera. */
const NEAR_W = 1e-6;

interface Clip { x: number; y: number; w: number }

function clipOf(m: ArrayLike<number>, x: number, y: number, z: number): Clip {
  return { x: m[0] * x + m[4] * y + m[8] * z + m[12], y: m[1] * x + m[5] * y + m[9] * z + m[13], w: m[3] * x + m[7] * y + m[11] * z + m[15] };
}

const toScreen = (c: Clip, v: Viewport): ScreenPoint => ({ x: ((c.x / c.w + 1) / 2) * v.width, y: ((1 - c.y / c.w) / 2) * v.height });

/** Screen position (CSS px from the canvas's top left) of a model point, and its clip w (distance along the view); null behind the camera. */
export function projectPoint(viewProjection: ArrayLike<number>, viewport: Viewport, x: number, y: number, z: number): (ScreenPoint & { w: number }) | null {
  const c = clipOf(viewProjection, x, y, z);
  if (c.w <= NEAR_W) return null;
  return { ...toScreen(c, viewport), w: c.w };
}

interface Candidate { distance: number; depth: number }

/** Keeps the better of two candidates: clearly nearer on screen, or overlapping and nearer the camera. */
function better(a: Candidate | null, b: Candidate): boolean {
  if (!a) return true;
  if (b.distance < a.distance - OVERLAP_PX) return true;
  if (b.distance > a.distance + OVERLAP_PX) return false;
  return b.depth < a.depth;
}

/** The node or member under the pointer, or null when nothing drawn is within `tolerancePx`. */
export function pickAt(scene: PickScene, viewProjection: ArrayLike<number>, viewport: Viewport, pointer: ScreenPoint, tolerancePx = PICK_TOLERANCE_PX): PickHit | null {
  const { positions, ends, memberMask, nodeMask } = scene;
  const m = viewProjection;

  let node: (Candidate & { index: number }) | null = null;
  const nodeCount = positions.length / 3;
  for (let k = 0; k < nodeCount; k += 1) {
    if (nodeMask && !nodeMask[k]) continue;
    const s = projectPoint(m, viewport, positions[k * 3], positions[k * 3 + 1], positions[k * 3 + 2]);
    if (!s) continue;
    const distance = Math.hypot(s.x - pointer.x, s.y - pointer.y);
    if (distance > tolerancePx) continue;
    const candidate = { distance, depth: s.w, index: k };
    if (better(node, candidate)) node = candidate;
  }
  if (node) {
    const k = node.index;
    return { kind: "node", index: k, point: [positions[k * 3], positions[k * 3 + 1], positions[k * 3 + 2]], distancePx: node.distance };
  }

  let member: (Candidate & { index: number; t: number }) | null = null;
  const memberCount = ends.length / 2;
  for (let k = 0; k < memberCount; k += 1) {
    if (memberMask && !memberMask[k]) continue;
    const a = ends[k * 2];
    const b = ends[k * 2 + 1];
    if (a < 0 || b < 0) continue;
    const hit = nearestOnSegment(m, viewport, pointer, positions, a, b);
    if (!hit || hit.distance > tolerancePx) continue;
    const candidate = { ...hit, index: k };
    if (better(member, candidate)) member = candidate;
  }
  if (!member) return null;
  const a = ends[member.index * 2] * 3;
  const b = ends[member.index * 2 + 1] * 3;
  const t = member.t;
  const point: Vec3 = [0, 1, 2].map((axis) => positions[a + axis] + (positions[b + axis] - positions[a + axis]) * t) as Vec3;
  return { kind: "member", index: member.index, point, t, distancePx: member.distance };
}

/**
 * Closest point of the segment between nodes a and b to the pointer, on screen: its pixel distance, its depth (clip
 * w) and its parameter t along the segment in model space. The part behind the camera is cut off first.
 */
function nearestOnSegment(m: ArrayLike<number>, viewport: Viewport, pointer: ScreenPoint, p: Float32Array, a: number, b: number): { distance: number; depth: number; t: number } | null {
  let ca = clipOf(m, p[a * 3], p[a * 3 + 1], p[a * 3 + 2]);
  let cb = clipOf(m, p[b * 3], p[b * 3 + 1], p[b * 3 + 2]);
  // Model-space parameters of the (possibly clipped) ends: clip coordinates are linear in t.
  let ta = 0;
  let tb = 1;
  if (ca.w <= NEAR_W && cb.w <= NEAR_W) return null;
  if (ca.w <= NEAR_W || cb.w <= NEAR_W) {
    const cut = (NEAR_W * 2 - ca.w) / (cb.w - ca.w);
    const at: Clip = { x: ca.x + (cb.x - ca.x) * cut, y: ca.y + (cb.y - ca.y) * cut, w: ca.w + (cb.w - ca.w) * cut };
    if (ca.w <= NEAR_W) {
      ca = at;
      ta = cut;
    } else {
      cb = at;
      tb = cut;
    }
  }
  const sa = toScreen(ca, viewport);
  const sb = toScreen(cb, viewport);
  const dx = sb.x - sa.x;
  const dy = sb.y - sa.y;
  const lengthSq = dx * dx + dy * dy;
  // s: position along the segment on screen (0 at a, 1 at b), clamped to the segment.
  const s = lengthSq === 0 ? 0 : Math.min(1, Math.max(0, ((pointer.x - sa.x) * dx + (pointer.y - sa.y) * dy) / lengthSq));
  const distance = Math.hypot(sa.x + dx * s - pointer.x, sa.y + dy * s - pointer.y);
  // Screen position is linear in 1/w, not in t: the perspective-correct model-space parameter of screen point s.
  const local = (s * ca.w) / ((1 - s) * cb.w + s * ca.w);
  const depth = ca.w + (cb.w - ca.w) * local;
  return { distance, depth, t: ta + (tb - ta) * local };
}
