"use client";
// The distance being measured: a dot at each picked point and a line between the two, drawn over the roof, and
// the read-out in metres over the canvas (issue 17 item 8). Points are picked by clicks while the measure tool is on.
import { useThree } from "@react-three/fiber";
import { useEffect, useMemo } from "react";
import { BufferGeometry, SphereGeometry, Vector3 } from "three";
import { palette } from "./config";
import { InstancedBodies } from "./layers/instanced-bodies";
import { distanceBetween, formatMetres } from "./measure";
import type { PreparedModel } from "./prepare";
import { useViewerStore } from "./viewer-store";

const dot = new SphereGeometry(1, 12, 8);
const dotMaterial = { color: palette.measure, depthTest: false };

export function MeasureLayer({ prepared }: { prepared: PreparedModel }) {
  const invalidate = useThree((s) => s.invalidate);
  const points = useViewerStore((s) => s.measurePoints);
  const line = useMemo(() => new BufferGeometry().setFromPoints(points.map((p) => new Vector3(...p.point))), [points]);
  useEffect(() => () => line.dispose(), [line]);
  useEffect(() => invalidate(), [line, invalidate]);
  const r = prepared.unitLength * 0.05;
  const bodies = useMemo(() => points.map((p) => ({ position: p.point, scale: r, colour: palette.measure })), [points, r]);
  return (
    <group name="measure">
      <InstancedBodies name="measure-points" geometry={dot} material={dotMaterial} bodies={bodies} renderOrder={4} />
      {points.length === 2 ? (
        // @ts-expect-error: "line" is three's Line in react-three-fiber, not the SVG element of React's DOM types.
        <line geometry={line} renderOrder={4}>
          <lineBasicMaterial color={palette.measure} depthTest={false} />
        </line>
      ) : null}
    </group>
  );
}

const describe = (p: { kind: string; id: string }) => (p.kind === "node" ? `node ${p.id}` : `member ${p.id}`);

/** What the measure tool asks for next, or the distance between the two points picked. */
export function MeasureReadout() {
  const tool = useViewerStore((s) => s.tool);
  const points = useViewerStore((s) => s.measurePoints);
  if (tool !== "measure") return null;
  let text: string;
  if (points.length === 0) text = "Measure: click a node or a point on a member.";
  else if (points.length === 1) text = `From ${describe(points[0])}: click the second point.`;
  else {
    const d = distanceBetween(points[0].point, points[1].point);
    text = `${formatMetres(d.distance)} from ${describe(points[0])} to ${describe(points[1])} (Δx ${formatMetres(d.dx)}, Δy ${formatMetres(d.dy)}, Δz ${formatMetres(d.dz)})`;
  }
  return (
    <p className="rounded bg-white/95 px-2 py-1 text-xs text-board-900 shadow" data-testid="measure-result" aria-live="polite">
      {text}
    </p>
  );
}
