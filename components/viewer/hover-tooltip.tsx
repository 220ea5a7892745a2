"use client";
// Hovered member id and its force in the chosen result, shown in a corner of the canvas (never per frame).
import type { ViewerAnalysis } from "./types";
import { useViewerStore } from "./viewer-store";

export function HoverTooltip({ analysis }: { analysis: ViewerAnalysis }) {
  const hovered = useViewerStore((s) => s.hoveredMemberId);
  const resultId = useViewerStore((s) => s.resultId);
  if (!hovered || !resultId) return null;
  const result = analysis.results[resultId];
  const force = result?.memberForces[hovered] ?? 0;
  const zero = result?.zeroForceMembers.includes(hovered);
  return (
    <div data-testid="viewer-hover" className="pointer-events-none rounded bg-board-900/90 px-2 py-1 font-mono text-xs text-white">
      {hovered}: {zero ? "zero-force" : `${force > 0 ? "tension" : "compression"} ${Math.abs(force).toFixed(1)} kN`}
    </div>
  );
}
