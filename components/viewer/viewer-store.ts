// The viewer's fast-changing state, outside React. Other layers and the live-session follower use it:
//   useViewerStore.getState().selectMember("M12")            select (null clears)
//   useViewerStore.getState().setCameraPose(pose, { animate }) move the camera (presenter following)
//   useViewerStore.getState().flyTo([x, y, z])                 aim the camera at a point, keeping the distance
//   useViewerStore.subscribe((s) => s.cameraPose, (pose) => …) hear camera moves (updated while the camera moves)
//   useViewerStore.subscribe((s) => s.selectedMemberId, …)     hear selection changes
//   useViewerStore.getState().showInfluence(map)              show a member's influence map (null clears); it is
//                                                             cleared when the selection or the revision changes
//   useViewerStore.getState().showMode(mode)                  draw a buckling or mechanism mode (null clears); it
//                                                             is cleared when the result or the revision changes
//   useViewerStore.getState().pickAt(clientX, clientY)        the node or member drawn under a screen point (exact,
//                                                             with a pixel tolerance; picking.ts), or null
//   useViewerStore.subscribe((s) => s.lastPick, …)            hear what the last click on the canvas picked (a node,
//                                                             a member and the point on it), null after a miss
//   useViewerStore.getState().setTool("pin")                  the next click on a member or node is where a new pin
//                                                             goes (`pinSpot`; "missed" after a click on empty space)
// Components read it with selectors (`useViewerStore((s) => s.colourMode)`); per-frame code uses getState().
import { create } from "zustand";
import { subscribeWithSelector } from "zustand/middleware";
import type { InfluenceMap } from "@/lib/review/influence";
import type { ColourMode, Legend } from "./colouring";
import { defaultFilters, type MemberFilters } from "./filters";
import type { LabelSpot } from "./labels";
import type { Vec3 as PickVec3 } from "./picking";

export type Vec3 = [number, number, number];
export interface CameraPose { position: Vec3; target: Vec3 }
export type CameraPreset = "plan" | "elevationSouth" | "elevationEast" | "isometric";

/** What the camera rig registers so that actions here can drive the real camera. */
export interface CameraController {
  getPose(): CameraPose;
  setPose(pose: CameraPose, animate: boolean): void;
  flyTo(point: Vec3): void;
  frameOn(centre: Vec3, radius: number): void;
  preset(name: CameraPreset): void;
  fit(): void;
  /** Renders the current view once and returns it as a PNG data URL. */
  exportPng(): string;
  /** Renders one frame now and reports its draw calls, triangles and time (used by the benchmark). */
  measureFrame(): { calls: number; triangles: number; ms: number };
  /** Instances drawn now per named instanced mesh (nodes, supports, load arrows, pins, …). */
  instanceCounts(): Record<string, number>;
  /** Names of instanced meshes drawing an instance with an identity matrix (see test-hook.ts). */
  unplacedInstances(): string[];
}

/** A node or member picked on screen, with the model point under the pointer (on the member's axis for a member). */
export interface PickedThing { kind: "member" | "node"; id: string; point: PickVec3 }

/** What the canvas registers so that picking can be asked from outside it (clicks, pins, tests). */
export interface Picker {
  /** The node or member drawn under a screen point (client coordinates), or null. */
  pickAt(clientX: number, clientY: number): PickedThing | null;
  /** Client coordinates of a model point as drawn now, or null when behind the camera. */
  screenOf(point: Vec3): { x: number; y: number } | null;
}

/**
 * What a click on the canvas does: select what is under it, add a point to the distance being measured, or choose
 * where a new pin goes.
 */
export type ViewerTool = "select" | "measure" | "pin";

export interface DeflectionSettings { enabled: boolean; scale: number }

/** A mode to draw instead of the deflected shape: its motion per model node (3 each, largest component 1). */
export interface ShownMode { label: string; nodeIds: readonly string[]; shape: readonly number[] }

export interface ViewerState {
  selectedMemberId: string | null;
  hoveredMemberId: string | null;
  /** A selected node (a node and a member are never selected together). */
  selectedNodeId: string | null;
  hoveredNodeId: string | null;
  /** What the last click on the canvas picked; null after a click on empty space. */
  lastPick: PickedThing | null;
  tool: ViewerTool;
  /** Points picked for a distance: none, one, or two (the distance is shown). */
  measurePoints: PickedThing[];
  /** Where the next pin goes, clicked with the "pin" tool; "missed" after a click on empty space in that mode. */
  pinSpot: PickedThing | "missed" | null;
  /** Member and node labels on; `labels` holds where the ones drawn now are (labels-layer.tsx). */
  labelsOn: boolean;
  labels: { spots: LabelSpot[]; inView: number } | null;
  /** Members drawn now (1 each, member order), written by the members layer after every filter change. */
  visibleMembers: Uint8Array | null;
  picker: Picker | null;
  resultId: string | null;
  compareResultId: string | null;
  colourMode: ColourMode;
  lowForceThreshold: number;
  filters: MemberFilters;
  deflection: DeflectionSettings;
  cameraPose: CameraPose | null;
  legend: Legend | null;
  /** Influence map of the selected member, drawn on the top-layer nodes; null when none is shown. */
  influence: InfluenceMap | null;
  /** A buckling or mechanism mode drawn on the roof; null when none is shown. */
  mode: ShownMode | null;
  controller: CameraController | null;

  selectMember(id: string | null): void;
  hoverMember(id: string | null): void;
  selectNode(id: string | null): void;
  /** Hover read-out: a member, a node, or nothing. */
  hover(thing: Pick<PickedThing, "kind" | "id"> | null): void;
  /** A click on the canvas at a screen point: picks, then selects (or clears) or adds a measuring point. */
  clickAt(clientX: number, clientY: number): void;
  pickAt(clientX: number, clientY: number): PickedThing | null;
  registerPicker(picker: Picker | null): void;
  setTool(tool: ViewerTool): void;
  /** Forgets the chosen pin spot (the pin was made, or the form was cleared). */
  clearPinSpot(): void;
  setVisibleMembers(mask: Uint8Array): void;
  setLabelsOn(on: boolean): void;
  setLabels(labels: { spots: LabelSpot[]; inView: number } | null): void;
  /** Turns the camera to frame a sphere, keeping the direction it looks from. */
  frameOn(centre: Vec3, radius: number): void;
  setResult(id: string): void;
  setCompareResult(id: string | null): void;
  setColourMode(mode: ColourMode): void;
  setLowForceThreshold(kN: number): void;
  setFilters(patch: Partial<MemberFilters>): void;
  setDeflection(patch: Partial<DeflectionSettings>): void;
  setCameraPose(pose: CameraPose, options?: { animate?: boolean }): void;
  flyTo(point: Vec3): void;
  applyPreset(name: CameraPreset): void;
  fitToView(): void;
  exportPng(): string | null;
  /** Called by the camera rig; also records where the camera is now (null when it unregisters). */
  registerController(controller: CameraController | null): void;
  /** Called by the camera rig whenever the camera moves. */
  reportCameraPose(pose: CameraPose): void;
  setLegend(legend: Legend): void;
  /** Shows an influence map if it belongs to the selected member (an answer that arrives late is dropped). */
  showInfluence(map: InfluenceMap | null): void;
  showMode(mode: ShownMode | null): void;
  /** Back to defaults when another revision is opened. */
  reset(resultId: string | null): void;
}

const initial = {
  selectedMemberId: null,
  hoveredMemberId: null,
  selectedNodeId: null,
  hoveredNodeId: null,
  lastPick: null,
  tool: "select" as ViewerTool,
  measurePoints: [],
  pinSpot: null,
  labels: null,
  compareResultId: null,
  colourMode: "forceState" as ColourMode,
  lowForceThreshold: 0,
  filters: defaultFilters,
  deflection: { enabled: false, scale: 0 },
  legend: null,
  influence: null,
  mode: null,
};

export const useViewerStore = create<ViewerState>()(
  subscribeWithSelector((set, get) => ({
    ...initial,
    resultId: null,
    cameraPose: null,
    controller: null,
    picker: null,
    visibleMembers: null,
    selectMember: (id) => {
      if (get().selectedMemberId !== id) set({ selectedMemberId: id, influence: null });
      if (id !== null && get().selectedNodeId !== null) set({ selectedNodeId: null });
    },
    hoverMember: (id) => {
      if (get().hoveredMemberId !== id) set({ hoveredMemberId: id });
    },
    selectNode: (id) => {
      if (id !== null) get().selectMember(null);
      if (get().selectedNodeId !== id) set({ selectedNodeId: id });
    },
    hover: (thing) => {
      const member = thing?.kind === "member" ? thing.id : null;
      const node = thing?.kind === "node" ? thing.id : null;
      if (get().hoveredMemberId !== member || get().hoveredNodeId !== node) set({ hoveredMemberId: member, hoveredNodeId: node });
    },
    pickAt: (clientX, clientY) => get().picker?.pickAt(clientX, clientY) ?? null,
    clickAt: (clientX, clientY) => {
      const picked = get().pickAt(clientX, clientY);
      set({ lastPick: picked });
      if (get().tool === "pin") {
        // One click places the pin; a miss keeps the mode so the next click can try again.
        set(picked ? { pinSpot: picked, tool: "select" } : { pinSpot: "missed" });
        return;
      }
      if (get().tool === "measure") {
        if (!picked) return;
        const points = get().measurePoints;
        set({ measurePoints: points.length >= 2 ? [picked] : [...points, picked] });
        return;
      }
      // A miss clears the selection: in a live session everyone's selection follows the presenter's.
      if (picked?.kind === "node") get().selectNode(picked.id);
      else {
        get().selectNode(null);
        get().selectMember(picked?.id ?? null);
      }
    },
    registerPicker: (picker) => set({ picker }),
    setTool: (tool) => set({ tool, measurePoints: [], ...(tool === "pin" ? { pinSpot: null } : {}) }),
    clearPinSpot: () => set({ pinSpot: null }),
    setVisibleMembers: (mask) => set({ visibleMembers: mask }),
    labelsOn: false,
    setLabelsOn: (on) => set({ labelsOn: on }),
    setLabels: (labels) => set({ labels }),
    frameOn: (centre, radius) => get().controller?.frameOn(centre, radius),
    setResult: (id) => set({ resultId: id, ...(id !== get().resultId ? { mode: null } : {}) }),
    setCompareResult: (id) => set({ compareResultId: id }),
    setColourMode: (mode) => set({ colourMode: mode }),
    setLowForceThreshold: (kN) => set({ lowForceThreshold: Math.max(0, kN) }),
    setFilters: (patch) => set({ filters: { ...get().filters, ...patch } }),
    setDeflection: (patch) => set({ deflection: { ...get().deflection, ...patch } }),
    setCameraPose: (pose, options) => {
      const controller = get().controller;
      if (controller) controller.setPose(pose, options?.animate ?? true);
      else set({ cameraPose: pose });
    },
    flyTo: (point) => get().controller?.flyTo(point),
    applyPreset: (name) => get().controller?.preset(name),
    fitToView: () => get().controller?.fit(),
    exportPng: () => get().controller?.exportPng() ?? null,
    // A camera that goes away takes its pose with it: the next canvas (another revision, another roof) is framed
    // afresh, unless a pose is asked for before it registers (a live-session follower's setCameraPose).
    registerController: (controller) => set({ controller, cameraPose: controller ? controller.getPose() : null }),
    reportCameraPose: (pose) => set({ cameraPose: pose }),
    setLegend: (legend) => set({ legend }),
    showInfluence: (map) => {
      if (map === null || map.member === get().selectedMemberId) set({ influence: map });
    },
    showMode: (mode) => set({ mode }),
    reset: (resultId) => set({ ...initial, resultId }),
  })),
);
