// Pure keyboard stepping through the members drawn now (issue 17 item 10): the arrow keys on the focused canvas
// move the selection to the next or previous visible member in the model's member order, wrapping at the ends.

/** What a key on the focused 3D view does; null for a key the view leaves alone. */
export type ViewerKeyAction = { step: 1 | -1 } | { clear: true } | null;

/** Arrow right/down step forward, left/up back; Escape clears the selection (closing its panel). */
export function viewerKeyAction(key: string): ViewerKeyAction {
  if (key === "ArrowRight" || key === "ArrowDown") return { step: 1 };
  if (key === "ArrowLeft" || key === "ArrowUp") return { step: -1 };
  if (key === "Escape") return { clear: true };
  return null;
}

/**
 * Index of the visible member `step` places from `current` (member order, wrapping), or -1 when none is drawn.
 * With nothing selected (current -1) a step forward lands on the first visible member and a step back on the last.
 * `visible` holds 1 per drawn member (the members layer's mask); null means every member is drawn.
 */
export function stepVisibleMember(count: number, visible: Uint8Array | null, current: number, step: 1 | -1): number {
  const shown = (k: number) => visible === null || visible[k] === 1;
  let k = current < 0 ? (step === 1 ? -1 : count) : current;
  for (let tried = 0; tried < count; tried += 1) {
    k = (k + step + count) % count;
    if (shown(k)) return k;
  }
  return -1;
}

/** The midpoint of member `k` (model coordinates): where the camera turns to when stepping brings it in. */
export function memberMidpoint(positions: Float32Array, ends: Int32Array, k: number): [number, number, number] {
  const a = ends[k * 2] * 3;
  const b = ends[k * 2 + 1] * 3;
  return [(positions[a] + positions[b]) / 2, (positions[a + 1] + positions[b + 1]) / 2, (positions[a + 2] + positions[b + 2]) / 2];
}

/**
 * Whether a point drawn at `screen` (client coordinates; null when behind the camera) lies inside `area` kept in
 * from each edge by `margin` times its size: a member stepped to outside it is off screen, so the camera follows.
 */
export function isInView(screen: { x: number; y: number } | null, area: { left: number; top: number; width: number; height: number }, margin: number): boolean {
  if (!screen) return false;
  const dx = area.width * margin;
  const dy = area.height * margin;
  return screen.x >= area.left + dx && screen.x <= area.left + area.width - dx && screen.y >= area.top + dy && screen.y <= area.top + area.height - dy;
}
