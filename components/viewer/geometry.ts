// Instance matrices for members drawn as unit cylinders (axis along +y, height 1, radius 1) stretched between
// their end nodes. Scratch objects are reused so a rewrite of ~30,000 instances allocates nothing per member.
import { Matrix4, Quaternion, Vector3 } from "three";

const axis = new Vector3(0, 1, 0);
const from = new Vector3();
const to = new Vector3();
const dir = new Vector3();
const mid = new Vector3();
const scale = new Vector3();
const rotation = new Quaternion();
const matrix = new Matrix4();
const hidden = new Matrix4().makeScale(0, 0, 0);

/** Writes the instance matrix of member k into `out` (16 floats at offset `slot * 16`); zero scale when hidden. */
export function writeMemberMatrix(out: Float32Array, slot: number, positions: Float32Array, ends: Int32Array, k: number, radius: number, visible: boolean): void {
  const a = ends[k * 2];
  const b = ends[k * 2 + 1];
  if (!visible || a < 0 || b < 0) {
    hidden.toArray(out, slot * 16);
    return;
  }
  from.fromArray(positions, a * 3);
  to.fromArray(positions, b * 3);
  dir.subVectors(to, from);
  const length = dir.length();
  if (length === 0) {
    hidden.toArray(out, slot * 16);
    return;
  }
  mid.addVectors(from, to).multiplyScalar(0.5);
  rotation.setFromUnitVectors(axis, dir.divideScalar(length));
  scale.set(radius, length, radius);
  matrix.compose(mid, rotation, scale).toArray(out, slot * 16);
}

/** Median member length: the unit that member radii and glyph sizes scale with. */
export function typicalMemberLength(positions: Float32Array, ends: Int32Array): number {
  const count = ends.length / 2;
  if (count === 0) return 1;
  const step = Math.max(1, Math.floor(count / 2000));
  const lengths: number[] = [];
  for (let k = 0; k < count; k += step) {
    const a = ends[k * 2] * 3;
    const b = ends[k * 2 + 1] * 3;
    if (a < 0 || b < 0) continue;
    lengths.push(Math.hypot(positions[b] - positions[a], positions[b + 1] - positions[a + 1], positions[b + 2] - positions[a + 2]));
  }
  lengths.sort((x, y) => x - y);
  return lengths[Math.floor(lengths.length / 2)] || 1;
}
