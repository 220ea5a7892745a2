"use client";
// The one <Canvas> of the viewer. Extra layers from other features (MEP runs and clashes, pins) are passed as
// `children` and rendered inside the scene, in model coordinates (metres, z up). A layer reads selection and
// camera from useViewerStore (see viewer-store.ts) and calls `invalidate()` from useThree after changing
// anything, because the canvas only draws on demand.
import { Canvas } from "@react-three/fiber";
import { useMemo, useState, type ReactNode } from "react";
import { CameraRig } from "./camera-rig";
import { cameraLook, memberLook, palette } from "./config";
import { deflectedPositions, modePositions, nodesInBox } from "./filters";
import { LoadsLayer, NodesLayer, SupportsLayer } from "./glyphs-layer";
import { MembersLayer } from "./members-layer";
import { LabelsLayer } from "./labels-layer";
import { MeasureLayer } from "./measure-layer";
import { PickerRig } from "./picker";
import type { PreparedModel } from "./prepare";
import type { WireColumns } from "@/lib/models/result-columns";
import { useViewerStore } from "./viewer-store";

export interface ViewerCanvasProps {
  prepared: PreparedModel;
  /** The chosen result's columns, and the compared result's (lib/models/result-columns.ts). */
  columns: WireColumns | undefined;
  compareColumns: WireColumns | undefined;
  /** True while the opening result's columns are on their way (not while a later result's are fetched). */
  awaitingColumns?: boolean;
  /** Extra scene layers (see the note at the top of this file). */
  children?: ReactNode;
}

function GroundGrid({ prepared }: { prepared: PreparedModel }) {
  const size = Math.ceil((prepared.span * 1.6) / 10) * 10 || 10;
  const divisions = Math.min(200, Math.max(10, Math.round(size / Math.max(1, Math.round(prepared.unitLength)))));
  return (
    <gridHelper
      args={[size, divisions, palette.gridMajor, palette.gridMinor]}
      rotation={[Math.PI / 2, 0, 0]}
      position={[prepared.centre[0], prepared.centre[1], prepared.minZ - prepared.unitLength * 0.5]}
    />
  );
}

function Scene({ prepared, columns, compareColumns, children }: ViewerCanvasProps) {
  const deflection = useViewerStore((s) => s.deflection);
  const mode = useViewerStore((s) => s.mode);
  const sectionBox = useViewerStore((s) => s.filters.sectionBox);
  const displacements = columns?.displacements;
  // a shown mode (buckling or mechanism) replaces the deflected shape until it is cleared
  const positions = useMemo(
    () =>
      mode
        ? modePositions(prepared.nodes, mode.nodeIds, mode.shape)
        : deflection.enabled && displacements
          ? deflectedPositions(prepared.nodes, displacements, deflection.scale)
          : prepared.nodes.positions,
    [prepared, displacements, deflection, mode],
  );
  // Nodes outside the section box are hidden with their supports and load arrows (by undeformed position).
  const nodeMask = useMemo(() => nodesInBox(prepared.nodes.positions, sectionBox), [prepared, sectionBox]);
  return (
    <>
      {/* An opaque background, so the PNG export is not transparent. */}
      <color attach="background" args={[palette.background]} />
      <ambientLight intensity={1.6} />
      <directionalLight position={[1, -2, 3]} intensity={1.4} />
      <GroundGrid prepared={prepared} />
      <MembersLayer prepared={prepared} columns={columns} compareColumns={compareColumns} positions={positions} />
      <NodesLayer prepared={prepared} positions={positions} nodeMask={nodeMask} />
      <SupportsLayer prepared={prepared} nodeMask={nodeMask} />
      <LoadsLayer prepared={prepared} nodeMask={nodeMask} />
      <CameraRig prepared={prepared} />
      <PickerRig prepared={prepared} positions={positions} nodeMask={nodeMask} />
      <LabelsLayer prepared={prepared} positions={positions} nodeMask={nodeMask} />
      <MeasureLayer prepared={prepared} />
      {children}
    </>
  );
}

/** The 3D scene: members, glyphs, grid and camera controls, plus any extra layers passed as children. */
export default function ViewerCanvas({ awaitingColumns = false, ...props }: ViewerCanvasProps) {
  const far = props.prepared.radius * 40;
  // No frame is drawn until the opening colouring can be: in a software rasteriser a frame of a big roof's glyphs
  // alone costs nearly what the whole roof does, and drawing it first only delays the roof (issue 13 navigation).
  // Latched: once the first columns are in, frames are drawn on demand whatever is fetched later.
  const [drawing, setDrawing] = useState(!awaitingColumns);
  if (!drawing && !awaitingColumns) setDrawing(true);
  return (
    <Canvas
      frameloop={drawing ? "demand" : "never"}
      dpr={[1, 2]}
      gl={{ antialias: props.prepared.memberIds.length <= memberLook.largeModel }}
      camera={{ fov: cameraLook.fov, up: [0, 0, 1], near: far / 10_000, far, position: [0, -1, 1] }}
      // Members and nodes carry no pointer handlers: a click that hits no pin or clash marker lands here and is
      // picked in screen space (picker.tsx), so a click on empty space selects nothing and clears the selection.
      onPointerMissed={(e) => {
        if (e.type === "click") useViewerStore.getState().clickAt(e.clientX, e.clientY);
      }}
      style={{ background: palette.background }}
      data-testid="viewer-canvas"
    >
      <Scene {...props} />
    </Canvas>
  );
}

