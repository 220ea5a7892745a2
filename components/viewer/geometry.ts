// Instance matrices for members drawn as unit cylinders (axis along +y, height 1, radius 1) stretched between
// their end nodes. Written straight into the instance buffer from the positions: a rewrite of ~30,000 instances
// allocates nothing and calls no three.js object per member (issue 13: nothing per member on the hot path).

/**
 * Writes the instance matrix of member k into `out` (16 floats at offset `slot * 16`, column-major as three.js
 * reads it); zero scale when hidden. The rotation is the shortest one taking +y to the member's direction d
 * (Rodrigues' formula about y × d, the rotation three.js's Quaternion.setFromUnitVectors gives), scaled by the
 * radius across and the length along, and moved to the member's midpoint.
 */
export function writeMemberMatrix(out: Float32Array, slot: number, positions: Float32Array, ends: Int32Array, k: number, radius: number, visible: boolean): void {
  const o = slot * 16;
  const a = ends[k * 2];
  const b = ends[k * 2 + 1];
  if (visible && a >= 0 && b >= 0) {
    const ax = positions[a * 3];
    const ay = positions[a * 3 + 1];
    const az = positions[a * 3 + 2];
    const dx = positions[b * 3] - ax;
    const dy = positions[b * 3 + 1] - ay;
    const dz = positions[b * 3 + 2] - az;
    const length = Math.hypot(dx, dy, dz);
    if (length > 0) {
      const x = dx / length;
      const y = dy / length;
      const z = dz / length;
      // Columns of the rotation R (R·ey = d). Pointing straight down (y = -1) the axis is undefined: a half turn
      // about z, as setFromUnitVectors does for opposite vectors.
      const down = y <= -1 + 1e-9;
      const f = down ? 0 : 1 / (1 + y);
      const r00 = down ? -1 : 1 - x * x * f;
      const r10 = down ? 0 : -x;
      const r20 = down ? 0 : -x * z * f;
      const r02 = down ? 0 : -x * z * f;
      const r12 = down ? 0 : -z;
      const r22 = down ? 1 : 1 - z * z * f;
      out[o] = r00 * radius;
      out[o + 1] = r10 * radius;
      out[o + 2] = r20 * radius;
      out[o + 3] = 0;
      out[o + 4] = dx;
      out[o + 5] = dy;
      out[o + 6] = dz;
      out[o + 7] = 0;
      out[o + 8] = r02 * radius;
      out[o + 9] = r12 * radius;
      out[o + 10] = r22 * radius;
      out[o + 11] = 0;
      out[o + 12] = ax + dx / 2;
      out[o + 13] = ay + dy / 2;
      out[o + 14] = az + dz / 2;
      out[o + 15] = 1;
      return;
    }
  }
  out.fill(0, o, o + 15);
  out[o + 15] = 1;
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
