"use client";
// Hovered member id and its force in the chosen result, shown in a corner of the canvas (never per frame); read
// from the result's columns at the member's index.
import { bitAt, type WireColumns } from "@/lib/models/result-columns";
import type { PreparedModel } from "./prepare";
import { useViewerStore } from "./viewer-store";

export function HoverTooltip({ prepared, columns }: { prepared: PreparedModel; columns: WireColumns | undefined }) {
  const hovered = useViewerStore((s) => s.hoveredMemberId);
  const k = hovered ? prepared.memberIndex.get(hovered) : undefined;
  if (!hovered || k === undefined || !columns) return null;
  const force = columns.forces[k];
  const zero = bitAt(columns.zero, k) === 1;
  return (
    <div data-testid="viewer-hover" className="pointer-events-none rounded bg-board-900/90 px-2 py-1 font-mono text-xs text-white">
      {hovered}: {zero ? "zero-force" : `${force > 0 ? "tension" : "compression"} ${Math.abs(force).toFixed(1)} kN`}
    </div>
  );
}
