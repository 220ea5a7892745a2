"use client";
// Orbit / pan / zoom with drei's CameraControls, z up. Registers a controller in the viewer store so toolbar
// buttons, PNG export and the live-session follower can drive the camera without React state.
import { CameraControls } from "@react-three/drei";
import { useThree } from "@react-three/fiber";
import { useEffect, useRef } from "react";
import { InstancedMesh, Matrix4, Vector3, type Object3D } from "three";
import { cameraLook } from "./config";
import { MergedInstances } from "./merged-instances";
import type { PreparedModel } from "./prepare";
import { useViewerStore, type CameraPose, type CameraPreset, type Vec3 } from "./viewer-store";

/** Unit view directions (from the target towards the camera) of the presets. */
const presetDirections: Record<CameraPreset, Vec3> = {
  plan: [0, -1e-3, 1],
  elevationSouth: [0, -1, 0],
  elevationEast: [1, 0, 0],
  isometric: [1, -1, 0.8],
};

const scratchPosition = new Vector3();
const scratchTarget = new Vector3();
const scratchMatrix = new Matrix4();
const identity = new Matrix4();
const never = new Matrix4().set(0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0);

/** Copies drawn by an instanced or merged mesh (the glyph and member layers), null for any other object. */
function copiesDrawn(object: Object3D): number | null {
  if (object instanceof InstancedMesh) return object.count;
  if (object instanceof MergedInstances) return object.copies;
  return null;
}

export function CameraRig({ prepared }: { prepared: PreparedModel }) {
  const controls = useRef<CameraControls>(null);
  const gl = useThree((s) => s.gl);
  const scene = useThree((s) => s.scene);
  const camera = useThree((s) => s.camera);

  useEffect(() => {
    const cc = controls.current;
    if (!cc) return;
    const fitDistance = () => {
      const fov = ((cameraLook.fov / 2) * Math.PI) / 180;
      return (prepared.radius * cameraLook.fitPadding) / Math.sin(fov);
    };
    const lookFrom = (dir: Vec3, animate: boolean) => {
      const d = new Vector3(...dir).normalize().multiplyScalar(fitDistance());
      const [cx, cy, cz] = prepared.centre;
      void cc.setLookAt(cx + d.x, cy + d.y, cz + d.z, cx, cy, cz, animate);
    };
    const getPose = (): CameraPose => {
      cc.getPosition(scratchPosition, false);
      cc.getTarget(scratchTarget, false);
      return { position: scratchPosition.toArray() as Vec3, target: scratchTarget.toArray() as Vec3 };
    };
    const store = useViewerStore.getState();
    const pending = store.cameraPose;
    if (pending) void cc.setLookAt(...pending.position, ...pending.target, false);
    else lookFrom(presetDirections.isometric, false);
    store.registerController({
      getPose,
      setPose: (pose, animate) => void cc.setLookAt(...pose.position, ...pose.target, animate),
      flyTo: (point) => {
        cc.getPosition(scratchPosition, true);
        cc.getTarget(scratchTarget, true);
        const offset = scratchPosition.sub(scratchTarget);
        void cc.setLookAt(point[0] + offset.x, point[1] + offset.y, point[2] + offset.z, ...point, true);
      },
      frameOn: (centre, radius) => {
        cc.getPosition(scratchPosition, true);
        cc.getTarget(scratchTarget, true);
        const fov = ((cameraLook.fov / 2) * Math.PI) / 180;
        const d = scratchPosition.sub(scratchTarget).normalize().multiplyScalar(Math.max(radius, 1e-3) / Math.sin(fov));
        void cc.setLookAt(centre[0] + d.x, centre[1] + d.y, centre[2] + d.z, ...centre, true);
      },
      preset: (name) => lookFrom(presetDirections[name], true),
      fit: () => {
        cc.getPosition(scratchPosition, true);
        cc.getTarget(scratchTarget, true);
        lookFrom(scratchPosition.sub(scratchTarget).toArray() as Vec3, true);
      },
      exportPng: () => {
        // Render once into the current buffer and read it back before the browser clears it.
        gl.render(scene, camera);
        return gl.domElement.toDataURL("image/png");
      },
      measureFrame: () => {
        const context = gl.getContext();
        const pixel = new Uint8Array(4);
        const start = performance.now();
        gl.render(scene, camera);
        // Reading one pixel waits for the GPU (or the software rasteriser) to finish the frame.
        context.readPixels(0, 0, 1, 1, context.RGBA, context.UNSIGNED_BYTE, pixel);
        const ms = performance.now() - start;
        return { calls: gl.info.render.calls, triangles: gl.info.render.triangles, ms };
      },
      instanceCounts: () => {
        const counts: Record<string, number> = {};
        scene.traverseVisible((object) => {
          const drawn = copiesDrawn(object);
          if (drawn !== null && object.name) counts[object.name] = (counts[object.name] ?? 0) + drawn;
        });
        return counts;
      },
      unplacedInstances: () => {
        const found: string[] = [];
        scene.traverseVisible((object) => {
          const drawn = copiesDrawn(object);
          if (drawn === null) return;
          const name = object.name || object.parent?.name || "unnamed";
          // More instances drawn than the buffer holds: the GPU reads past it (WebGL's bufferSubData error).
          if (object instanceof InstancedMesh && object.count * 16 > object.instanceMatrix.array.length) {
            found.push(`${name} (more instances than its buffer holds)`);
            return;
          }
          const mesh = object as InstancedMesh | MergedInstances;
          for (let k = 0; k < drawn; k += 1) {
            // still the identity (an InstancedMesh's start) or all zero (a merged copy never placed)
            const matrix = mesh.getMatrixAt(k, scratchMatrix);
            if (!matrix.equals(identity) && !matrix.equals(never)) continue;
            found.push(name);
            return;
          }
        });
        return found;
      },
    });
    const report = () => useViewerStore.getState().reportCameraPose(getPose());
    cc.addEventListener("update", report);
    return () => {
      cc.removeEventListener("update", report);
      useViewerStore.getState().registerController(null);
    };
  }, [prepared, gl, scene, camera]);

  return <CameraControls ref={controls} makeDefault />;
}
