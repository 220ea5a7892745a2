"use client";
// All members as two instanced meshes (opaque, and thin translucent for zero-force): two draw calls whatever the
// member count. Switching result, colouring or filter rewrites the instance buffers in place, from the result's
// columns (typed arrays in member order) without looking any member up by id.
import { useFrame, useThree } from "@react-three/fiber";
import { useEffect, useLayoutEffect, useMemo, useRef } from "react";
import { CylinderGeometry, DynamicDrawUsage, InstancedBufferAttribute, InstancedMesh, MeshBasicMaterial, MeshLambertMaterial } from "three";
import type { WireColumns } from "@/lib/models/result-columns";
import { comparesTwoResults, computeAppearance, forceStates, hexToRgb, type MemberAppearance } from "./colouring";
import { memberLook, palette } from "./config";
import { disposeInstancedMesh } from "./dispose";
import { visibleMask } from "./filters";
import { writeMemberMatrix } from "./geometry";
import type { PreparedModel } from "./prepare";
import { resultLabel } from "./prepare";
import { useViewerStore } from "./viewer-store";

interface Layer { mesh: InstancedMesh; order: Int32Array }

function makeLayer(count: number, translucent: boolean): Layer {
  const segments = count > memberLook.largeModel ? memberLook.radialSegmentsLarge : memberLook.radialSegments;
  const geometry = new CylinderGeometry(1, 1, 1, segments, 1, true);
  const material = translucent
    ? new MeshBasicMaterial({ transparent: true, opacity: memberLook.translucentOpacity, depthWrite: false })
    : new MeshLambertMaterial();
  const mesh = new InstancedMesh(geometry, material, Math.max(1, count));
  mesh.instanceMatrix.setUsage(DynamicDrawUsage);
  mesh.instanceColor = new InstancedBufferAttribute(new Float32Array(Math.max(1, count) * 3), 3).setUsage(DynamicDrawUsage);
  mesh.frustumCulled = false;
  mesh.renderOrder = translucent ? 1 : 0;
  mesh.count = 0;
  return { mesh, order: new Int32Array(Math.max(1, count)) };
}

const selectionRgb = hexToRgb(palette.selection);
const hoverRgb = hexToRgb(palette.hover);

function writeColours(layer: Layer, look: MemberAppearance, selected: number, hovered: number) {
  const colours = layer.mesh.instanceColor!.array as Float32Array;
  for (let slot = 0; slot < layer.mesh.count; slot += 1) {
    const k = layer.order[slot];
    const rgb = k === selected ? selectionRgb : k === hovered ? hoverRgb : look.colours.subarray(k * 3, k * 3 + 3);
    colours[slot * 3] = rgb[0];
    colours[slot * 3 + 1] = rgb[1];
    colours[slot * 3 + 2] = rgb[2];
  }
  layer.mesh.instanceColor!.needsUpdate = true;
}

/** Sorts visible members into the solid or faint layer and writes their instance matrices. */
function writeMatrices(layers: { solid: Layer; faint: Layer }, look: MemberAppearance, mask: Uint8Array, positions: Float32Array, ends: Int32Array) {
  const { solid, faint } = layers;
  const solidMatrices = solid.mesh.instanceMatrix.array as Float32Array;
  const faintMatrices = faint.mesh.instanceMatrix.array as Float32Array;
  let s = 0;
  let f = 0;
  for (let k = 0; k < mask.length; k += 1) {
    if (!mask[k]) continue;
    if (look.translucent[k]) {
      faint.order[f] = k;
      writeMemberMatrix(faintMatrices, f, positions, ends, k, look.radii[k], true);
      f += 1;
    } else {
      solid.order[s] = k;
      writeMemberMatrix(solidMatrices, s, positions, ends, k, look.radii[k], true);
      s += 1;
    }
  }
  solid.mesh.count = s;
  faint.mesh.count = f;
  for (const layer of [solid, faint]) {
    layer.mesh.instanceMatrix.needsUpdate = true;
    layer.mesh.computeBoundingSphere();
  }
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
  const layers = useMemo(() => ({ solid: makeLayer(count, false), faint: makeLayer(count, true) }), [count]);
  useEffect(
    () => () => {
      for (const layer of [layers.solid, layers.faint]) disposeInstancedMesh(layer.mesh);
    },
    [layers],
  );

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
    writeMatrices(layers, look, mask, positions, prepared.ends);
    useViewerStore.getState().setVisibleMembers(mask);
    invalidate();
  }, [look, mask, positions, prepared, layers, invalidate]);

  // Colours, including the selection and hover highlight.
  useLayoutEffect(() => {
    if (!look) return;
    const selected = selectedId ? (prepared.memberIndex.get(selectedId) ?? -1) : -1;
    const hovered = hoveredId ? (prepared.memberIndex.get(hoveredId) ?? -1) : -1;
    writeColours(layers.solid, look, selected, hovered);
    writeColours(layers.faint, look, selected, hovered);
    invalidate();
  }, [look, filters, positions, selectedId, hoveredId, prepared, layers, invalidate]);

  // No pointer handlers here: picking is done in screen space with a pixel tolerance (picker.tsx).
  return (
    <>
      {[layers.solid, layers.faint].map((layer, n) => (
        <primitive key={n} object={layer.mesh} />
      ))}
    </>
  );
}
