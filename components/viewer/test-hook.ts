// `window.__strutroom`: a small hook for browser tests and the viewer benchmark, where clicking into a WebGL canvas
// is unreliable. It only calls the same store actions the UI uses.
import type { StateCounts } from "./colouring";
import type { PreparedModel } from "./prepare";
import { useViewerStore } from "./viewer-store";

export interface StrutroomTestHook {
  selectMember(id: string | null): void;
  setResult(id: string): void;
  getLegendCounts(): StateCounts | null;
  /** Draw calls and triangles of the last frame, and the time to render one frame now (ms). */
  measureFrame(): { calls: number; triangles: number; ms: number } | null;
  memberCount: number;
  /** Label of the buckling or mechanism mode drawn, or null. */
  shownMode(): string | null;
}

declare global {
  interface Window {
    __strutroom?: StrutroomTestHook;
  }
}

/** Installs the hook for the model on screen; returns the clean-up. */
export function installTestHook(prepared: PreparedModel): () => void {
  window.__strutroom = {
    selectMember: (id) => useViewerStore.getState().selectMember(id),
    setResult: (id) => useViewerStore.getState().setResult(id),
    getLegendCounts: () => useViewerStore.getState().legend?.counts ?? null,
    measureFrame: () => useViewerStore.getState().controller?.measureFrame() ?? null,
    memberCount: prepared.memberIds.length,
    shownMode: () => useViewerStore.getState().mode?.label ?? null,
  };
  return () => {
    delete window.__strutroom;
  };
}
