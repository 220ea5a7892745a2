"use client";
// Drawing a run: while the draft is active, a transparent plane at the chosen height catches clicks (snapped to
// the grid step by the draft store), and the draft polyline is drawn in sky with a dot per point.
import { useThree, type ThreeEvent } from "@react-three/fiber";
import { useEffect, useMemo } from "react";
import { BufferGeometry, Vector3 } from "three";
import { useRunDraftStore } from "@/components/clashes/run-draft-store";
import { mepLook } from "./mep-runs-layer";

// Large enough for any roof we model (spans up to 300 m); only its height matters.
const PLANE_SIZE = 1000;

export function RunDraftLayer() {
  const invalidate = useThree((s) => s.invalidate);
  const active = useRunDraftStore((s) => s.active);
  const height = useRunDraftStore((s) => s.height);
  const points = useRunDraftStore((s) => s.points);
  const line = useMemo(() => new BufferGeometry().setFromPoints(points.map((p) => new Vector3(p.x, p.y, p.z))), [points]);
  useEffect(() => invalidate(), [active, height, points, invalidate]);
  useEffect(() => () => line.dispose(), [line]);
  if (!active) return null;
  const handleClick = (event: ThreeEvent<MouseEvent>) => {
    event.stopPropagation();
    useRunDraftStore.getState().addPoint(event.point.x, event.point.y);
  };
  return (
    <group name="run-draft">
      <mesh position={[0, 0, height]} onClick={handleClick}>
        <planeGeometry args={[PLANE_SIZE, PLANE_SIZE]} />
        <meshBasicMaterial color={mepLook.run} transparent opacity={0.06} depthWrite={false} />
      </mesh>
      {/* @ts-expect-error: "line" is three's Line in react-three-fiber, not the SVG element of React's DOM types. */}
      <line geometry={line}>
        <lineBasicMaterial color={mepLook.run} />
      </line>
      {points.map((p, k) => (
        <mesh key={k} position={[p.x, p.y, p.z]}>
          <sphereGeometry args={[0.15, 12, 8]} />
          <meshBasicMaterial color={mepLook.run} />
        </mesh>
      ))}
    </group>
  );
}
