"use client";
// MEP layer of the viewer: runs drawn translucent in sky (#0284c7) with their real section (round = cylinder,
// rectangular = box turned by its rotation, insulation included), and clashes as rose (#e11d48) markers. Each
// kind of body is one instanced mesh (instanced-bodies.tsx), so the layer costs at most four draw calls however many
// segments and clashes a project has.
import { useMemo } from "react";
import { BoxGeometry, CylinderGeometry, Matrix4, Quaternion, SphereGeometry, Vector3 } from "three";
import { sectionAxes } from "@/lib/clash/run-geometry";
import type { Run } from "@/lib/mep/schemas";
import { InstancedBodies, type Body } from "./instanced-bodies";

export const mepLook = {
  run: "#0284c7",
  runOpacity: 0.45,
  clash: "#e11d48",
  /** Marker radius in metres; the selected clash is drawn larger. */
  clashRadius: 0.35,
  selectedScale: 1.8,
} as const;

export interface ClashMarker {
  id: string;
  kind: "hard" | "clearance";
  point: { x: number; y: number; z: number };
}

const unitCylinder = new CylinderGeometry(0.5, 0.5, 1, 16);
const unitBox = new BoxGeometry(1, 1, 1);
const unitSphere = new SphereGeometry(1, 16, 12);

interface SegmentPose {
  key: string;
  shape: "round" | "rectangular";
  position: [number, number, number];
  quaternion: Quaternion;
  scale: [number, number, number];
}

/** Position, orientation and size of each run segment's body (with insulation). */
function segmentPoses(runs: Run[]): SegmentPose[] {
  const poses: SegmentPose[] = [];
  for (const run of runs) {
    for (let k = 0; k < run.points.length - 1; k++) {
      const a = new Vector3(run.points[k].x, run.points[k].y, run.points[k].z);
      const b = new Vector3(run.points[k + 1].x, run.points[k + 1].y, run.points[k + 1].z);
      const length = a.distanceTo(b);
      const u = b.clone().sub(a).normalize();
      const mid = a.clone().add(b).multiplyScalar(0.5);
      const key = `${run.id}:${k}`;
      if (run.profile.shape === "round") {
        const d = run.profile.diameter + 2 * run.insulation;
        // The cylinder's own axis is y.
        poses.push({ key, shape: "round", position: mid.toArray(), quaternion: new Quaternion().setFromUnitVectors(new Vector3(0, 1, 0), u), scale: [d, length, d] });
      } else {
        const [w, h] = sectionAxes([u.x, u.y, u.z], run.profile.rotation);
        const basis = new Matrix4().makeBasis(u, new Vector3(...w), new Vector3(...h));
        poses.push({
          key,
          shape: "rectangular",
          position: mid.toArray(),
          quaternion: new Quaternion().setFromRotationMatrix(basis),
          scale: [length, run.profile.width + 2 * run.insulation, run.profile.height + 2 * run.insulation],
        });
      }
    }
  }
  return poses;
}

// Hard clashes solid, clearance clashes as a wire cage: the kind reads without colour too. Drawn over the roof.
const hardMaterial = { color: mepLook.clash, depthTest: false };
const clearanceMaterial = { color: mepLook.clash, wireframe: true, depthTest: false };
const runMaterial = { color: mepLook.run, transparent: true, opacity: mepLook.runOpacity, depthWrite: false };

function ClashMarkers({ clashes, wireframe, selectedClashId, onSelectClash }: { clashes: ClashMarker[]; wireframe: boolean; selectedClashId: string | null; onSelectClash?: (id: string) => void }) {
  const bodies = useMemo(
    () => clashes.map((clash): Body => ({ position: [clash.point.x, clash.point.y, clash.point.z], scale: mepLook.clashRadius * (clash.id === selectedClashId ? mepLook.selectedScale : 1) })),
    [clashes, selectedClashId],
  );
  return (
    <InstancedBodies
      name={wireframe ? "clash-markers-clearance" : "clash-markers-hard"}
      geometry={unitSphere}
      material={wireframe ? clearanceMaterial : hardMaterial}
      bodies={bodies}
      renderOrder={3}
      onPick={(k) => onSelectClash?.(clashes[k].id)}
    />
  );
}

function RunBodies({ poses, shape }: { poses: SegmentPose[]; shape: SegmentPose["shape"] }) {
  const bodies = useMemo(() => poses.filter((pose) => pose.shape === shape).map((pose): Body => ({ position: pose.position, quaternion: pose.quaternion, scale: pose.scale })), [poses, shape]);
  return <InstancedBodies name={`mep-runs-${shape}`} geometry={shape === "round" ? unitCylinder : unitBox} material={runMaterial} bodies={bodies} renderOrder={2} />;
}

export function MepRunsLayer({ runs, clashes, selectedClashId, onSelectClash }: { runs: Run[]; clashes: ClashMarker[]; selectedClashId: string | null; onSelectClash?: (id: string) => void }) {
  const poses = useMemo(() => segmentPoses(runs), [runs]);
  const hard = useMemo(() => clashes.filter((clash) => clash.kind === "hard"), [clashes]);
  const clearance = useMemo(() => clashes.filter((clash) => clash.kind === "clearance"), [clashes]);
  return (
    <group name="mep-runs">
      <RunBodies poses={poses} shape="round" />
      <RunBodies poses={poses} shape="rectangular" />
      <ClashMarkers clashes={hard} wireframe={false} selectedClashId={selectedClashId} onSelectClash={onSelectClash} />
      <ClashMarkers clashes={clearance} wireframe selectedClashId={selectedClashId} onSelectClash={onSelectClash} />
    </group>
  );
}
