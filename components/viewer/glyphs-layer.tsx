"use client";
// Nodes, supports and loads drawn with our own simple glyphs: one merged mesh each (merged-instances.ts; loads use
// two, shaft and head), so glyph draw calls stay constant however big the roof is. All share one material kind with
// a colour per vertex, so the first frame compiles one shader program for them; a large roof gets lighter shapes.
import { useThree } from "@react-three/fiber";
import { useEffect, useLayoutEffect, useMemo } from "react";
import { BufferGeometry, Color, ConeGeometry, CylinderGeometry, Matrix4, MeshLambertMaterial, OctahedronGeometry, Quaternion, TetrahedronGeometry, Vector3 } from "three";
import { glyphLook, memberLook, palette } from "./config";
import { MergedInstances } from "./merged-instances";
import { loadArrowCapacity, nodalLoadsFor, type PreparedModel } from "./prepare";
import { useViewerStore } from "./viewer-store";

function useGlyphMesh(name: string, geometry: BufferGeometry, capacity: number): MergedInstances {
  const mesh = useMemo(() => {
    const m = new MergedInstances(geometry, new MeshLambertMaterial(), capacity);
    m.name = name;
    return m;
  }, [name, geometry, capacity]);
  useEffect(() => () => mesh.dispose(), [mesh]);
  return mesh;
}

const yAxis = new Vector3(0, 1, 0);
const position = new Vector3();
const direction = new Vector3();
const scale = new Vector3();
const rotation = new Quaternion();
const matrix = new Matrix4();

/** Shows the first `count` copies after they were placed and coloured. */
function commitInstances(mesh: MergedInstances, count: number) {
  mesh.copies = count;
  mesh.commit();
}

/** A roof with so many members that its glyphs are a few pixels across (config.ts memberLook.largeModel). */
const isLarge = (prepared: PreparedModel) => prepared.memberIds.length > memberLook.largeModel;

const nodeRgb = new Color(palette.node);
const loadRgb = new Color(palette.load);
const selectedRgb = new Color(palette.selection);

/** Small octahedra at the nodes (inside the section box), following the deflected shape; the selected node in violet. */
export function NodesLayer({ prepared, positions, nodeMask }: { prepared: PreparedModel; positions: Float32Array; nodeMask: Uint8Array | null }) {
  const invalidate = useThree((s) => s.invalidate);
  const selectedNodeId = useViewerStore((s) => s.selectedNodeId);
  const large = isLarge(prepared);
  const geometry = useMemo(() => (large ? new TetrahedronGeometry(1, 0) : new OctahedronGeometry(1, 0)), [large]);
  const mesh = useGlyphMesh("nodes", geometry, prepared.nodes.ids.length);
  useLayoutEffect(() => {
    const selected = selectedNodeId ? (prepared.nodes.index.get(selectedNodeId) ?? -1) : -1;
    const r = glyphLook.nodeRadius * prepared.unitLength;
    let n = 0;
    for (let k = 0; k < prepared.nodes.ids.length; k += 1) {
      if (nodeMask && !nodeMask[k]) continue;
      // The selected node is drawn larger too, so it reads without colour.
      const size = k === selected ? r * 2 : r;
      matrix.makeScale(size, size, size).setPosition(positions[k * 3], positions[k * 3 + 1], positions[k * 3 + 2]);
      mesh.setMatrixAt(n, matrix);
      mesh.setColorAt(n, k === selected ? selectedRgb : nodeRgb);
      n += 1;
    }
    commitInstances(mesh, n);
    invalidate();
  }, [mesh, positions, prepared, nodeMask, selectedNodeId, invalidate]);
  return <primitive object={mesh} />;
}

/** A pyramid under each supported node: dark when all three translations are held, light when some are free. */
export function SupportsLayer({ prepared, nodeMask }: { prepared: PreparedModel; nodeMask: Uint8Array | null }) {
  const invalidate = useThree((s) => s.invalidate);
  const geometry = useMemo(() => new ConeGeometry(0.5, 1, 4).translate(0, -0.5, 0).rotateX(Math.PI / 2), []);
  const supports = prepared.model.supports;
  const mesh = useGlyphMesh("supports", geometry, supports.length);
  useLayoutEffect(() => {
    const size = glyphLook.supportSize * prepared.unitLength;
    const held = new Color(palette.support);
    const partial = new Color(palette.zeroForce);
    let n = 0;
    for (const support of supports) {
      const k = prepared.nodes.index.get(support.node);
      if (k === undefined || (nodeMask && !nodeMask[k])) continue;
      // The cone's apex is at its origin with the base below it, so the apex touches the node from below.
      matrix.makeScale(size, size, size).setPosition(prepared.nodes.positions[k * 3], prepared.nodes.positions[k * 3 + 1], prepared.nodes.positions[k * 3 + 2]);
      mesh.setMatrixAt(n, matrix);
      mesh.setColorAt(n, support.ux && support.uy && support.uz ? held : partial);
      n += 1;
    }
    commitInstances(mesh, n);
    invalidate();
  }, [mesh, supports, prepared, nodeMask, invalidate]);
  return <primitive object={mesh} />;
}

/** Arrows for the nodal loads of the chosen load case (factored and summed for a combination), ending at the node. */
export function LoadsLayer({ prepared, nodeMask }: { prepared: PreparedModel; nodeMask: Uint8Array | null }) {
  const invalidate = useThree((s) => s.invalidate);
  const resultId = useViewerStore((s) => s.resultId);
  const loads = useMemo(() => (resultId ? nodalLoadsFor(prepared.model, resultId) : []), [prepared, resultId]);
  const capacity = useMemo(() => loadArrowCapacity(prepared.model), [prepared]);
  const large = isLarge(prepared);
  const shaftGeometry = useMemo(
    () => new CylinderGeometry(1, 1, 1, large ? glyphLook.arrowSidesLarge : glyphLook.arrowShaftSides, 1, large).translate(0, -0.5, 0),
    [large],
  );
  const headGeometry = useMemo(() => new ConeGeometry(1, 1, large ? glyphLook.arrowSidesLarge : glyphLook.arrowHeadSides, 1, large).translate(0, -0.5, 0), [large]);
  const shafts = useGlyphMesh("load-arrow-shafts", shaftGeometry, capacity);
  const heads = useGlyphMesh("load-arrow-heads", headGeometry, capacity);
  useLayoutEffect(() => {
    let largest = 0;
    for (const load of loads) largest = Math.max(largest, Math.hypot(load.fx, load.fy, load.fz));
    const longest = glyphLook.maxLoadArrow * prepared.unitLength;
    let n = 0;
    for (const load of loads) {
      const k = prepared.nodes.index.get(load.node);
      const magnitude = Math.hypot(load.fx, load.fy, load.fz);
      if (k === undefined || magnitude === 0 || largest === 0 || (nodeMask && !nodeMask[k])) continue;
      const length = Math.max(0.25, magnitude / largest) * longest;
      const head = Math.min(length * 0.35, prepared.unitLength * 0.15);
      // Unit geometry has its tip at the origin and its body along -y: turn +y to the force direction so the
      // arrow points along the force with its tip on the node.
      direction.set(load.fx, load.fy, load.fz).divideScalar(magnitude);
      rotation.setFromUnitVectors(yAxis, direction);
      position.fromArray(prepared.nodes.positions, k * 3);
      matrix.compose(position, rotation, scale.set(head * 0.35, head, head * 0.35));
      heads.setMatrixAt(n, matrix);
      heads.setColorAt(n, loadRgb);
      position.addScaledVector(direction, -head);
      matrix.compose(position, rotation, scale.set(head * 0.08, length - head, head * 0.08));
      shafts.setMatrixAt(n, matrix);
      shafts.setColorAt(n, loadRgb);
      n += 1;
    }
    commitInstances(shafts, n);
    commitInstances(heads, n);
    invalidate();
  }, [loads, prepared, nodeMask, shafts, heads, invalidate]);
  return (
    <group>
      <primitive object={shafts} />
      <primitive object={heads} />
    </group>
  );
}
