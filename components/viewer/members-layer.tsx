"use client";
// All members as one merged mesh (merged-instances.ts) with two materials, opaque and thin translucent (zero-force):
// the opaque members fill its first slots, the translucent ones the next, two draw calls whatever the member count.
// Switching result, colouring or filter rewrites its vertex buffers in place, from the result's columns (typed arrays
// in member order) without looking any member up by id.
import { useFrame, useThree } from "@react-three/fiber";
import { useEffect, useLayoutEffect, useMemo, useRef } from "react";
import { CylinderGeometry, MeshBasicMaterial, MeshLambertMaterial } from "three";
import type { WireColumns } from "@/lib/models/result-columns";
import { comparesTwoResults, computeAppearance, forceStates, hexToRgb, type MemberAppearance } from "./colouring";
import { memberLook, palette } from "./config";
import { visibleMask } from "./filters";
import { writeMemberMatrix } from "./geometry";
import { MergedInstances } from "./merged-instances";
import type { PreparedModel } from "./prepare";
import { resultLabel } from "./prepare";
import { useViewerStore } from "./viewer-store";

/** Slot s of the layer's mesh draws member order[s]. */
interface Layer { mesh: MergedInstances; order: Int32Array }

function makeLayer(count: number): Layer {
  const segments = count > memberLook.largeModel ? memberLook.radialSegmentsLarge : memberLook.radialSegments;
  const solid = new MeshLambertMaterial();
  const faint = new MeshBasicMaterial({ transparent: true, opacity: memberLook.translucentOpacity, depthWrite: false });
  const mesh = new MergedInstances(new CylinderGeometry(1, 1, 1, segments, 1, true), [solid, faint], count);
  mesh.name = "members";
  // the translucent members are drawn before the MEP runs (render order 2) and the measure marks (4)
  mesh.renderOrder = 1;
  return { mesh, order: new Int32Array(Math.max(1, count)) };
}

const selectionRgb = hexToRgb(palette.selection);
const hoverRgb = hexToRgb(palette.hover);

function writeColours(layer: Layer, look: MemberAppearance, selected: number, hovered: number) {
  const colours = look.colours;
  for (let slot = 0; slot < layer.mesh.copies; slot += 1) {
    const k = layer.order[slot];
    if (k === selected) layer.mesh.setRgbAt(slot, selectionRgb[0], selectionRgb[1], selectionRgb[2]);
    else if (k === hovered) layer.mesh.setRgbAt(slot, hoverRgb[0], hoverRgb[1], hoverRgb[2]);
    else layer.mesh.setRgbAt(slot, colours[k * 3], colours[k * 3 + 1], colours[k * 3 + 2]);
  }
  layer.mesh.commit({ places: false });
}

/** Places the visible members, opaque ones first, then the translucent (matrix, then the merged vertices). */
function writeMatrices(layer: Layer, look: MemberAppearance, mask: Uint8Array, positions: Float32Array, ends: Int32Array) {
  let opaque = 0;
  let shown = 0;
  for (let k = 0; k < mask.length; k += 1) {
    if (!mask[k]) continue;
    shown += 1;
    if (!look.translucent[k]) opaque += 1;
  }
  let s = 0;
  let f = opaque;
  for (let k = 0; k < mask.length; k += 1) {
    if (!mask[k]) continue;
    const slot = look.translucent[k] ? f++ : s++;
    layer.order[slot] = k;
    writeMemberMatrix(layer.mesh.matrices, slot, positions, ends, k, look.radii[k], true);
    layer.mesh.placeFromMatrices(slot);
  }
  layer.mesh.setGroups([opaque, shown - opaque]);
  layer.mesh.commit({ colours: false });
}

interface MembersLayerProps {
  prepared: PreparedModel;
  /** The chosen result's columns, and the other result's for the "compare" colouring (undefined while fetched). */
  columns: WireColumns | undefined;
  compareColumns: WireColumns | undefined;
  positions: Float32Array;
}

/** Draws and colours members; publishes the legend and the members drawn (for picking) to the viewer store. */
export function MembersLayer({ prepared, columns, compareColumns, positions }: MembersLayerProps) {
  const invalidate = useThree((s) => s.invalidate);
  const resultId = useViewerStore((s) => s.resultId);
  const compareResultId = useViewerStore((s) => s.compareResultId);
  const mode = useViewerStore((s) => s.colourMode);
  const threshold = useViewerStore((s) => s.lowForceThreshold);
  const filters = useViewerStore((s) => s.filters);
  const selectedId = useViewerStore((s) => s.selectedMemberId);
  const hoveredId = useViewerStore((s) => s.hoveredMemberId);

  const count = prepared.memberIds.length;
  const layer = useMemo(() => makeLayer(count), [count]);
  useEffect(() => () => layer.mesh.dispose(), [layer]);

  // Which members pass the filters: the legend counts these (issue 17 item 9) and only these are drawn.
  const mask = useMemo(() => {
    if (!columns || columns.memberCount !== count) return null;
    return visibleMask({ memberIds: prepared.memberIds, ends: prepared.ends, positions, groups: prepared.groups, states: forceStates(columns), filters });
  }, [columns, count, prepared, positions, filters]);

  const look = useMemo(() => {
    if (!columns || !resultId || !mask || columns.memberCount !== count) return null;
    const compare = compareResultId && compareResultId !== resultId ? compareColumns : undefined;
    // Comparing waits for the other result's columns rather than showing the force state under a compare heading.
    if (comparesTwoResults(mode) && (!compare || compare.memberCount !== count)) return null;
    return computeAppearance({
      columns,
      resultLabel: resultLabel(prepared.model, resultId),
      mode,
      memberIds: prepared.memberIds,
      unitLength: prepared.unitLength,
      lowForceThreshold: threshold,
      compareColumns: compare,
      compareLabel: compareResultId ? resultLabel(prepared.model, compareResultId) : undefined,
      shown: mask,
    });
  }, [columns, compareColumns, prepared, count, resultId, compareResultId, mode, threshold, mask]);

  // A User Timing mark on the first frame that draws a new colouring: the benchmark and profiling read it.
  const drawnMark = useRef(false);
  useEffect(() => {
    if (!look) return;
    useViewerStore.getState().setLegend(look.legend);
    drawnMark.current = true;
  }, [look]);
  useFrame(() => {
    if (!drawnMark.current) return;
    drawnMark.current = false;
    performance.mark("viewer:colouring-drawn");
  });

  // Matrices: which layer each member goes to, and where it is.
  useLayoutEffect(() => {
    if (!look || !mask) return;
    writeMatrices(layer, look, mask, positions, prepared.ends);
    useViewerStore.getState().setVisibleMembers(mask);
    invalidate();
  }, [look, mask, positions, prepared, layer, invalidate]);

  // Colours, including the selection and hover highlight.
  useLayoutEffect(() => {
    if (!look) return;
    const selected = selectedId ? (prepared.memberIndex.get(selectedId) ?? -1) : -1;
    const hovered = hoveredId ? (prepared.memberIndex.get(hoveredId) ?? -1) : -1;
    writeColours(layer, look, selected, hovered);
    invalidate();
  }, [look, filters, positions, selectedId, hoveredId, prepared, layer, invalidate]);

  // No pointer handlers here: picking is done in screen space with a pixel tolerance (picker.tsx).
  return <primitive object={layer.mesh} />;
}
