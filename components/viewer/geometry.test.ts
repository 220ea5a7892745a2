import { Matrix4, Quaternion, Vector3 } from "three";
import { describe, expect, it } from "vitest";
import { writeMemberMatrix } from "./geometry";

// Reference: three.js itself (a general-purpose npm library), composing the same instance matrix the way its
// documentation shows: position at the midpoint, Quaternion.setFromUnitVectors(+y, direction), scale (r, L, r).
function threeMatrix(a: number[], b: number[], radius: number): number[] {
  const from = new Vector3(...a);
  const dir = new Vector3(...b).sub(from);
  const length = dir.length();
  const mid = from.clone().addScaledVector(dir, 0.5);
  const rotation = new Quaternion().setFromUnitVectors(new Vector3(0, 1, 0), dir.divideScalar(length));
  return new Matrix4().compose(mid, rotation, new Vector3(radius, length, radius)).toArray();
}

describe("a member's instance matrix", () => {
  const cases: [string, number[], number[]][] = [
    ["a sloping diagonal", [1, 2, 3], [4, -1, 5.5]],
    ["a chord along x", [0, 0, 0], [3, 0, 0]],
    ["a chord along y", [0, 3, 0], [0, 6, 0]],
    ["a member pointing straight down (-y)", [0, 6, 0], [0, 3, 0]],
    ["a vertical post along z", [2, 2, 0], [2, 2, 2.5]],
    ["a member nearly along -y", [0, 0, 0], [1e-6, -3, 1e-6]],
  ];
  it.each(cases)("matches three.js's compose for %s", (_, a, b) => {
    const positions = new Float32Array([...a, ...b]);
    const out = new Float32Array(32);
    writeMemberMatrix(out, 1, positions, new Int32Array([0, 1]), 0, 0.05, true);
    const expected = threeMatrix(Array.from(positions.subarray(0, 3)), Array.from(positions.subarray(3, 6)), 0.05);
    Array.from(out.subarray(16)).forEach((value, n) => expect(value).toBeCloseTo(expected[n], 5));
    expect(Array.from(out.subarray(0, 16))).toEqual(new Array(16).fill(0));
  });

  it("is a zero scale (drawn as nothing) when hidden, of zero length or missing an end", () => {
    const hidden = new Matrix4().makeScale(0, 0, 0).toArray();
    const positions = new Float32Array([0, 0, 0, 1, 1, 1]);
    for (const [ends, visible] of [[[0, 1], false], [[0, 0], true], [[0, -1], true]] as const) {
      const out = new Float32Array(16).fill(7);
      writeMemberMatrix(out, 0, positions, new Int32Array(ends), 0, 0.05, visible);
      expect(Array.from(out)).toEqual(hidden);
    }
  });
});
