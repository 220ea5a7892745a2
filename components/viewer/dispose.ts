import type { InstancedMesh } from "three";

/** Frees an instanced mesh's GPU resources: its geometry, its material(s) and its instance buffers. */
export function disposeInstancedMesh(mesh: InstancedMesh): void {
  mesh.geometry.dispose();
  for (const material of [mesh.material].flat()) material.dispose();
  mesh.dispose();
}
