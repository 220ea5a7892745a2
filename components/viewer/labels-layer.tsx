"use client";
// Member and node labels (issue 17 item 8): while they are on, each drawn frame works out which labels to show
// (labels.ts: in view, at most MAX_LABELS, the selection always) and publishes their screen spots to the viewer
// store; LabelsOverlay draws them as plain text over the canvas. Frames are drawn on demand, so nothing runs while
// the camera is still.
import { useFrame, useThree } from "@react-three/fiber";
import { useEffect } from "react";
import { Matrix4 } from "three";
import { labelSpots } from "./labels";
import type { PreparedModel } from "./prepare";
import { useViewerStore } from "./viewer-store";

const viewProjection = new Matrix4();

export function LabelsLayer({ prepared, positions, nodeMask }: { prepared: PreparedModel; positions: Float32Array; nodeMask: Uint8Array | null }) {
  const on = useViewerStore((s) => s.labelsOn);
  const selectedMember = useViewerStore((s) => s.selectedMemberId);
  const selectedNode = useViewerStore((s) => s.selectedNodeId);
  const visibleMembers = useViewerStore((s) => s.visibleMembers);
  const invalidate = useThree((s) => s.invalidate);
  // Anything that changes what is labelled asks for a frame, where the labels are worked out.
  useEffect(() => {
    if (!on) useViewerStore.getState().setLabels(null);
    invalidate();
  }, [on, selectedMember, selectedNode, visibleMembers, positions, nodeMask, invalidate]);

  useFrame(({ camera, size }) => {
    if (!on) return;
    camera.updateMatrixWorld();
    viewProjection.multiplyMatrices(camera.projectionMatrix, camera.matrixWorldInverse);
    const labels = labelSpots(
      {
        positions,
        ends: prepared.ends,
        memberIds: prepared.memberIds,
        nodeIds: prepared.nodes.ids,
        memberMask: visibleMembers,
        nodeMask,
        selectedMember: selectedMember ? (prepared.memberIndex.get(selectedMember) ?? -1) : -1,
        selectedNode: selectedNode ? (prepared.nodes.index.get(selectedNode) ?? -1) : -1,
      },
      viewProjection.elements,
      { width: size.width, height: size.height },
    );
    useViewerStore.getState().setLabels(labels);
  });
  return null;
}

/** The labels as text over the canvas (positioned in canvas pixels), and how many are shown of those in view. */
export function LabelsOverlay() {
  const labels = useViewerStore((s) => s.labels);
  if (!labels) return null;
  return (
    <div className="pointer-events-none absolute inset-0 overflow-hidden" data-testid="viewer-labels" data-in-view={labels.inView}>
      {labels.spots.map((spot) => (
        <span
          key={spot.key}
          data-testid="viewer-label"
          data-id={spot.text}
          className={`absolute -translate-x-1/2 -translate-y-full whitespace-nowrap rounded px-1 font-mono text-[10px] leading-tight ${spot.kind === "node" ? "bg-board-900/80 text-white" : "bg-white/85 text-board-900"}`}
          style={{ left: spot.x, top: spot.y }}
        >
          {spot.text}
        </span>
      ))}
      {labels.inView > labels.spots.length ? (
        <p className="absolute bottom-3 right-3 rounded bg-white/90 px-2 py-1 text-xs text-board-700" data-testid="viewer-labels-note">
          Labels on the {labels.spots.length} nearest the middle of {labels.inView} in view; zoom in for more.
        </p>
      ) : null}
    </div>
  );
}
