// Which member and node labels to draw (issue 17 item 8): only what is drawn and inside the view, at most a fixed
// number nearest the middle of the view, plus the selection always; so a 28,800-member roof costs a few hundred
// positioned <div>s at most, however far it is zoomed out. Pure: positions come projected by the caller.
import { projectPoint, type Viewport } from "./picking";

export interface LabelSpot { key: string; kind: "member" | "node"; text: string; x: number; y: number }

export interface LabelInput {
  positions: Float32Array;
  ends: Int32Array;
  memberIds: readonly string[];
  nodeIds: readonly string[];
  memberMask: Uint8Array | null;
  nodeMask: Uint8Array | null;
  selectedMember: number;
  selectedNode: number;
}

/** Most labels drawn at once; past this the ones nearest the middle of the view are kept. */
export const MAX_LABELS = 150;

/** Screen spots of the labels to draw, and how many members and nodes are in view (for "showing 150 of N"). */
export function labelSpots(input: LabelInput, viewProjection: ArrayLike<number>, viewport: Viewport, limit = MAX_LABELS): { spots: LabelSpot[]; inView: number } {
  const { positions: p, ends, memberIds, nodeIds, memberMask, nodeMask } = input;
  const candidates: (LabelSpot & { rank: number })[] = [];
  let inView = 0;
  const cx = viewport.width / 2;
  const cy = viewport.height / 2;
  const consider = (kind: "member" | "node", k: number, text: string, x: number, y: number, z: number, selected: boolean) => {
    const s = projectPoint(viewProjection, viewport, x, y, z);
    if (!s) return;
    const inside = s.x >= 0 && s.x <= viewport.width && s.y >= 0 && s.y <= viewport.height;
    if (!inside && !selected) return;
    if (inside) inView += 1;
    // The selection sorts first; then distance from the middle of the view.
    candidates.push({ key: `${kind}:${k}`, kind, text, x: s.x, y: s.y, rank: selected ? -1 : Math.hypot(s.x - cx, s.y - cy) });
  };
  for (let k = 0; k < nodeIds.length; k += 1) {
    if (nodeMask && !nodeMask[k] && k !== input.selectedNode) continue;
    consider("node", k, nodeIds[k], p[k * 3], p[k * 3 + 1], p[k * 3 + 2], k === input.selectedNode);
  }
  for (let k = 0; k < memberIds.length; k += 1) {
    if (memberMask && !memberMask[k] && k !== input.selectedMember) continue;
    const a = ends[k * 2] * 3;
    const b = ends[k * 2 + 1] * 3;
    if (a < 0 || b < 0) continue;
    consider("member", k, memberIds[k], (p[a] + p[b]) / 2, (p[a + 1] + p[b + 1]) / 2, (p[a + 2] + p[b + 2]) / 2, k === input.selectedMember);
  }
  if (candidates.length > limit) {
    candidates.sort((u, v) => u.rank - v.rank);
    candidates.length = limit;
  }
  return { spots: candidates.map(({ key, kind, text, x, y }) => ({ key, kind, text, x, y })), inView };
}
