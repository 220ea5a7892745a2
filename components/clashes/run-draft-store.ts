"use client";
// Drawing a run in the viewer: while active, clicks on the drawing plane (a chosen height) add points snapped to
// the grid step. Points live outside React state of the canvas so the layer and the form share them.
import { create } from "zustand";

export type DraftPoint = { x: number; y: number; z: number };

interface RunDraft {
  active: boolean;
  height: number;
  snap: number;
  points: DraftPoint[];
  start(height: number, snap: number): void;
  addPoint(x: number, y: number): void;
  undo(): void;
  stop(): void;
}

/** Rounds to the nearest multiple of the snap step (no snapping when the step is 0). */
export function snapTo(value: number, step: number): number {
  return step > 0 ? Math.round(value / step) * step : value;
}

export const useRunDraftStore = create<RunDraft>()((set, get) => ({
  active: false,
  height: 1,
  snap: 0.5,
  points: [],
  start: (height, snap) => set({ active: true, height, snap, points: [] }),
  addPoint: (x, y) => {
    const { height, snap, points } = get();
    const point = { x: snapTo(x, snap), y: snapTo(y, snap), z: height };
    const last = points[points.length - 1];
    // A second click on the same snapped spot would make a zero-length segment.
    if (last && last.x === point.x && last.y === point.y) return;
    set({ points: [...points, point] });
  },
  undo: () => set({ points: get().points.slice(0, -1) }),
  stop: () => set({ active: false, points: [] }),
}));
