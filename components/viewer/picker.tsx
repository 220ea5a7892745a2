"use client";
// Connects the screen-space picking (picking.ts) to the canvas: registers a picker in the viewer store (used by
// clicks on empty canvas, pins and browser tests) and keeps the hover read-out on what is under the pointer. The
// members carry no r3f pointer handlers, so a click that hits no pin or clash reaches the canvas's
// onPointerMissed, which asks this picker (viewer-canvas.tsx).
import { useThree } from "@react-three/fiber";
import { useEffect } from "react";
import { Matrix4 } from "three";
import { pickAt, projectPoint } from "./picking";
import type { PreparedModel } from "./prepare";
import { useViewerStore, type PickedThing } from "./viewer-store";

const viewProjection = new Matrix4();

export function PickerRig({ prepared, positions, nodeMask }: { prepared: PreparedModel; positions: Float32Array; nodeMask: Uint8Array | null }) {
  const camera = useThree((s) => s.camera);
  const gl = useThree((s) => s.gl);

  useEffect(() => {
    const canvas = gl.domElement;
    const frame = () => {
      const rect = canvas.getBoundingClientRect();
      camera.updateMatrixWorld();
      viewProjection.multiplyMatrices(camera.projectionMatrix, camera.matrixWorldInverse);
      return { rect, matrix: viewProjection.elements, viewport: { width: rect.width, height: rect.height } };
    };
    const pick = (clientX: number, clientY: number): PickedThing | null => {
      const { rect, matrix, viewport } = frame();
      const memberMask = useViewerStore.getState().visibleMembers;
      const hit = pickAt({ positions, ends: prepared.ends, memberMask, nodeMask }, matrix, viewport, { x: clientX - rect.left, y: clientY - rect.top });
      if (!hit) return null;
      const id = hit.kind === "node" ? prepared.nodes.ids[hit.index] : prepared.memberIds[hit.index];
      return { kind: hit.kind, id, point: hit.point };
    };
    useViewerStore.getState().registerPicker({
      pickAt: pick,
      screenOf: (point) => {
        const { rect, matrix, viewport } = frame();
        const s = projectPoint(matrix, viewport, ...point);
        return s ? { x: rect.left + s.x, y: rect.top + s.y } : null;
      },
    });

    // Hover: at most once per animation frame, and not while a button is held (the camera is being dragged).
    let pending: PointerEvent | null = null;
    let request = 0;
    const onMove = (event: PointerEvent) => {
      if (event.buttons !== 0) return;
      pending = event;
      if (request) return;
      request = requestAnimationFrame(() => {
        request = 0;
        if (!pending) return;
        const picked = pick(pending.clientX, pending.clientY);
        useViewerStore.getState().hover(picked);
      });
    };
    const onLeave = () => {
      pending = null;
      useViewerStore.getState().hover(null);
    };
    canvas.addEventListener("pointermove", onMove);
    canvas.addEventListener("pointerleave", onLeave);
    return () => {
      cancelAnimationFrame(request);
      canvas.removeEventListener("pointermove", onMove);
      canvas.removeEventListener("pointerleave", onLeave);
      useViewerStore.getState().registerPicker(null);
    };
  }, [camera, gl, prepared, positions, nodeMask]);

  return null;
}
