"use client";
// The influence map of the selected member (viewer store `influence`): one small sphere at each top-layer node,
// coloured on the diverging influence scale (influence-colours.ts). One instanced mesh, so one draw call however
// many nodes the roof has; the buffers are rewritten when another map arrives and emptied when it is cleared.
import { useThree } from "@react-three/fiber";
import { useEffect, useLayoutEffect, useMemo } from "react";
import { DynamicDrawUsage, InstancedBufferAttribute, InstancedMesh, Matrix4, MeshLambertMaterial, SphereGeometry } from "three";
import { influenceLook } from "../config";
import { disposeInstancedMesh } from "../dispose";
import { influenceColours, type InfluenceValue } from "../influence-colours";
import type { PreparedModel } from "../prepare";
import { useViewerStore } from "../viewer-store";

const matrix = new Matrix4();

/** Writes one sphere per valued node into the instance buffers (none when `values` is empty). */
function writeInfluence(mesh: InstancedMesh, values: readonly InfluenceValue[], prepared: PreparedModel) {
  const colours = influenceColours(values);
  const target = mesh.instanceColor!.array as Float32Array;
  const p = prepared.nodes.positions;
  const r = influenceLook.radius * prepared.unitLength;
  let count = 0;
  values.forEach((v, k) => {
    const n = prepared.nodes.index.get(v.node);
    if (n === undefined) return;
    matrix.makeScale(r, r, r).setPosition(p[n * 3], p[n * 3 + 1], p[n * 3 + 2]);
    mesh.setMatrixAt(count, matrix);
    target.set(colours.subarray(k * 3, k * 3 + 3), count * 3);
    count += 1;
  });
  mesh.count = count;
  // hidden when empty, so no frame compiles its shader for nothing (issue 13: the first frame of a big roof)
  mesh.visible = count > 0;
  mesh.instanceMatrix.needsUpdate = true;
  mesh.instanceColor!.needsUpdate = true;
}

export function InfluenceLayer({ prepared }: { prepared: PreparedModel }) {
  const invalidate = useThree((s) => s.invalidate);
  const influence = useViewerStore((s) => s.influence);
  const capacity = Math.max(1, prepared.nodes.ids.length);
  const mesh = useMemo(() => {
    const m = new InstancedMesh(new SphereGeometry(1, influenceLook.widthSegments, influenceLook.heightSegments), new MeshLambertMaterial(), capacity);
    m.instanceMatrix.setUsage(DynamicDrawUsage);
    m.instanceColor = new InstancedBufferAttribute(new Float32Array(capacity * 3), 3).setUsage(DynamicDrawUsage);
    m.frustumCulled = false;
    m.count = 0;
    m.name = "influence-map";
    return m;
  }, [capacity]);
  useEffect(() => () => disposeInstancedMesh(mesh), [mesh]);

  useLayoutEffect(() => {
    writeInfluence(mesh, influence?.values ?? [], prepared);
    invalidate();
  }, [mesh, influence, prepared, invalidate]);

  return <primitive object={mesh} />;
}
