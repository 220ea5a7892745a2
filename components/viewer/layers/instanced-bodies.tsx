"use client";
// One instanced mesh for a list of bodies (pins, MEP runs, clash markers): one draw call however many there are.
// Matrices and colours are written in a layout effect before the frame that shows them, and the mesh is rebuilt
// when the list outgrows it. drei's <Instances> was used before: it sized its buffers once, at the first render
// (so a list that grew overran them: WebGL's "bufferSubData: srcOffset + length too large"), and copied each
// instance's place in a frame callback that runs before the scene's matrices are updated, so a body added while
// the canvas was idle stayed at the origin as a unit sphere until the camera moved.
import { useThree, type ThreeEvent } from "@react-three/fiber";
import { useEffect, useLayoutEffect, useMemo } from "react";
import { Color, DynamicDrawUsage, InstancedBufferAttribute, InstancedMesh, Matrix4, MeshStandardMaterial, Quaternion, Vector3, type BufferGeometry, type MeshStandardMaterialParameters } from "three";

export interface Body {
  position: readonly [number, number, number];
  quaternion?: Quaternion;
  scale: number | readonly [number, number, number];
  colour?: string;
}

const matrix = new Matrix4();
const position = new Vector3();
const scale = new Vector3();
const noTurn = new Quaternion();
const colour = new Color();

/** Capacity in steps of powers of two, so a list that grows one by one rebuilds the mesh only now and then. */
const capacityFor = (count: number) => 2 ** Math.ceil(Math.log2(Math.max(1, count)));

/** Writes every body's matrix and colour and shows exactly that many instances. */
function writeBodies(mesh: InstancedMesh, bodies: readonly Body[]) {
  bodies.forEach((body, k) => {
    const s = body.scale;
    if (typeof s === "number") scale.set(s, s, s);
    else scale.set(s[0], s[1], s[2]);
    matrix.compose(position.set(body.position[0], body.position[1], body.position[2]), body.quaternion ?? noTurn, scale);
    mesh.setMatrixAt(k, matrix);
    mesh.setColorAt(k, colour.set(body.colour ?? "#ffffff"));
  });
  mesh.count = bodies.length;
  // Hidden when empty: three.js would still compile its shader on the first frame (a physically based one, the
  // dearest to compile in a software renderer) to draw nothing (issue 13: the first frame of a big roof).
  mesh.visible = bodies.length > 0;
  mesh.instanceMatrix.needsUpdate = true;
  mesh.instanceColor!.needsUpdate = true;
  // Raycasting (clicks on pins and clash markers) tests this sphere first; it must follow the bodies.
  mesh.computeBoundingSphere();
}

export function InstancedBodies({
  name,
  geometry,
  material,
  bodies,
  renderOrder = 0,
  onPick,
}: {
  name: string;
  geometry: BufferGeometry;
  /** Material settings; keep the object stable (a module constant) or the material is rebuilt on every render. */
  material: MeshStandardMaterialParameters;
  bodies: readonly Body[];
  renderOrder?: number;
  /** Called with the index of the body clicked. */
  onPick?: (index: number) => void;
}) {
  const invalidate = useThree((s) => s.invalidate);
  const capacity = capacityFor(bodies.length);
  const shading = useMemo(() => new MeshStandardMaterial({ color: "#ffffff", ...material }), [material]);
  const mesh = useMemo(() => {
    const m = new InstancedMesh(geometry, shading, capacity);
    m.instanceMatrix.setUsage(DynamicDrawUsage);
    m.instanceColor = new InstancedBufferAttribute(new Float32Array(capacity * 3).fill(1), 3).setUsage(DynamicDrawUsage);
    m.count = 0;
    m.name = name;
    m.renderOrder = renderOrder;
    return m;
  }, [geometry, shading, capacity, name, renderOrder]);
  useEffect(() => () => mesh.dispose(), [mesh]);
  useEffect(() => () => shading.dispose(), [shading]);

  useLayoutEffect(() => {
    writeBodies(mesh, bodies);
    invalidate();
  }, [mesh, bodies, invalidate]);

  const handlers = onPick
    ? {
        onClick: (event: ThreeEvent<MouseEvent>) => {
          if (event.instanceId === undefined) return;
          event.stopPropagation();
          onPick(event.instanceId);
        },
      }
    : {};
  return <primitive object={mesh} {...handlers} />;
}
