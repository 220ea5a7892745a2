"use client";
// What is under the pointer, shown in a corner of the canvas (never per frame): a member with its force in the
// chosen result, read from the result's columns at the member's index, or a node with its id.
import { bitAt, type WireColumns } from "@/lib/models/result-columns";
import { forceStateOf } from "@/lib/vocabulary/force-state";
import type { PreparedModel } from "./prepare";
import { useViewerStore } from "./viewer-store";

export function HoverTooltip({ prepared, columns }: { prepared: PreparedModel; columns: WireColumns | undefined }) {
  const hovered = useViewerStore((s) => s.hoveredMemberId);
  const hoveredNode = useViewerStore((s) => s.hoveredNodeId);
  const resultId = useViewerStore((s) => s.resultId);
  const box = "pointer-events-none rounded bg-board-900/90 px-2 py-1 font-mono text-xs text-white";
  if (hoveredNode) {
    return (
      <div data-testid="viewer-hover" className={box}>
        Node {hoveredNode}
      </div>
    );
  }
  const k = hovered ? prepared.memberIndex.get(hovered) : undefined;
  if (!hovered || k === undefined || !columns) return null;
  const force = columns.forces[k];
  const state = forceStateOf(force, bitAt(columns.zero, k) === 1);
  return (
    <div data-testid="viewer-hover" className={box}>
      {hovered}: {state === "zero-force" ? state : `${state} ${Math.abs(force).toFixed(1)} kN`} in {resultId}
    </div>
  );
}
