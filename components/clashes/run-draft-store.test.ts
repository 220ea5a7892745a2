import { beforeEach, describe, expect, it } from "vitest";
import { snapTo, useRunDraftStore } from "./run-draft-store";

describe("drawing a run", () => {
  beforeEach(() => useRunDraftStore.getState().stop());

  it("snaps to the grid step (nearest multiple) and leaves values alone without a step", () => {
    // 3.26 / 0.5 = 6.52 → 7 × 0.5 = 3.5; −1.24 / 0.5 = −2.48 → −2 × 0.5 = −1.0.
    expect(snapTo(3.26, 0.5)).toBe(3.5);
    expect(snapTo(-1.24, 0.5)).toBe(-1);
    expect(snapTo(3.26, 0)).toBe(3.26);
  });

  it("adds snapped points at the chosen height and ignores a repeated spot", () => {
    const draft = useRunDraftStore.getState();
    draft.start(1.2, 0.5);
    useRunDraftStore.getState().addPoint(0.1, 0.2);
    useRunDraftStore.getState().addPoint(0.2, -0.1); // snaps to the same (0, 0): no zero-length segment
    useRunDraftStore.getState().addPoint(2.9, 0.1);
    expect(useRunDraftStore.getState().points).toEqual([{ x: 0, y: 0, z: 1.2 }, { x: 3, y: 0, z: 1.2 }]);
    useRunDraftStore.getState().undo();
    expect(useRunDraftStore.getState().points).toHaveLength(1);
  });
});
