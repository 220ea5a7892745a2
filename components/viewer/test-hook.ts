// `window.__strutroom`: a small hook for browser tests and the viewer benchmark, where clicking into a WebGL canvas
// is unreliable. It only calls the same store actions the UI uses.
import type { StateCounts } from "./colouring";
import type { PreparedModel } from "./prepare";
import { useViewerStore, type CameraPose } from "./viewer-store";

export interface StrutroomTestHook {
  selectMember(id: string | null): void;
  setResult(id: string): void;
  getLegendCounts(): StateCounts | null;
  /** Draw calls and triangles of the last frame, and the time to render one frame now (ms). */
  measureFrame(): { calls: number; triangles: number; ms: number } | null;
  memberCount: number;
  /** Label of the buckling or mechanism mode drawn, or null. */
  shownMode(): string | null;
  /**
   * Client coordinates where a node, or the point at fraction t along a member (0 at its first node), is drawn
   * now; null when it is behind the camera. Browser tests click there with the real mouse.
   */
  screenOf(kind: "member" | "node", id: string, t?: number): { x: number; y: number } | null;
  selectNode(id: string | null): void;
  /** Instances drawn now per named glyph mesh: "nodes", "supports", "load-arrow-heads", "pins", … */
  instanceCounts(): Record<string, number>;
  /** What is selected now. */
  selection(): { member: string | null; node: string | null };
  /** Where the camera is and what it looks at now (null before the canvas is drawn). */
  cameraPose(): CameraPose | null;
  /**
   * Drawn instances whose matrix is still the identity (a unit glyph at the model origin): an instance drawn before
   * its place was written, or more instances drawn than the mesh's buffer holds. Named by the mesh's name or its
   * parent group's.
   */
  unplacedInstances(): string[];
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
    screenOf: (kind, id, t = 0.5) => {
      const picker = useViewerStore.getState().picker;
      const p = prepared.nodes.positions;
      if (!picker) return null;
      if (kind === "node") {
        const k = prepared.nodes.index.get(id);
        return k === undefined ? null : picker.screenOf([p[k * 3], p[k * 3 + 1], p[k * 3 + 2]]);
      }
      const k = prepared.memberIndex.get(id);
      if (k === undefined) return null;
      const a = prepared.ends[k * 2] * 3;
      const b = prepared.ends[k * 2 + 1] * 3;
      return picker.screenOf([p[a] + (p[b] - p[a]) * t, p[a + 1] + (p[b + 1] - p[a + 1]) * t, p[a + 2] + (p[b + 2] - p[a + 2]) * t]);
    },
    selectNode: (id) => useViewerStore.getState().selectNode(id),
    instanceCounts: () => useViewerStore.getState().controller?.instanceCounts() ?? {},
    unplacedInstances: () => useViewerStore.getState().controller?.unplacedInstances() ?? [],
    selection: () => {
      const s = useViewerStore.getState();
      return { member: s.selectedMemberId, node: s.selectedNodeId };
    },
    cameraPose: () => useViewerStore.getState().controller?.getPose() ?? null,
  };
  return () => {
    delete window.__strutroom;
  };
}
