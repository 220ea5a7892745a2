import { describe, expect, it } from "vitest";
import { anchorLabel, nearestOnSegment, resolveAnchor, roundToMillimetre } from "./anchors";

// A two-member fragment of a roof; revision 2 drops member D-2 and moves nothing else.
const revision1 = {
  nodes: [
    { id: "N1", x: 0, y: 0, z: 0 },
    { id: "N2", x: 3, y: 0, z: 0 },
    { id: "N3", x: 1.5, y: 1.5, z: 2 },
  ],
  members: [
    { id: "BC-1", i: "N1", j: "N2" },
    { id: "D-2", i: "N1", j: "N3" },
  ],
};
const revision2 = { nodes: revision1.nodes, members: [revision1.members[0]] };

describe("resolveAnchor", () => {
  it("puts a member pin at the member's midpoint and a node pin on the node", () => {
    expect(resolveAnchor({ kind: "member", id: "BC-1" }, revision1)).toEqual([1.5, 0, 0]);
    expect(resolveAnchor({ kind: "member", id: "D-2" }, revision1)).toEqual([0.75, 0.75, 1]);
    expect(resolveAnchor({ kind: "node", id: "N3" }, revision1)).toEqual([1.5, 1.5, 2]);
  });

  it("follows a member id into the next revision, and detaches when it is gone", () => {
    expect(resolveAnchor({ kind: "member", id: "BC-1" }, revision2)).toEqual([1.5, 0, 0]);
    expect(resolveAnchor({ kind: "member", id: "D-2" }, revision2)).toBeNull();
  });

  it("uses the clash point when it is known, and the point itself for point pins", () => {
    expect(resolveAnchor({ kind: "clash", id: "CL-1" }, revision1, new Map([["CL-1", [1, 2, 3]]]))).toEqual([1, 2, 3]);
    expect(resolveAnchor({ kind: "clash", id: "CL-9" }, revision1)).toBeNull();
    expect(resolveAnchor({ kind: "point", point: [4, 5, 6] }, revision1)).toEqual([4, 5, 6]);
  });
});

describe("pins placed with a click in 3D", () => {
  it("draws a member pin at the point clicked on the member's axis, and a node pin on the node", () => {
    expect(resolveAnchor({ kind: "member", id: "BC-1", point: [0.6, 0, 0] }, revision1)).toEqual([0.6, 0, 0]);
    expect(resolveAnchor({ kind: "node", id: "N2", point: [3, 0, 0] }, revision1)).toEqual([3, 0, 0]);
  });

  it("keeps a member pin on the member when a later revision moved it, and detaches it when the member is gone", () => {
    // Revision 3 lifts N2 by 4 m: BC-1 runs from (0,0,0) to (3,0,4), 5 m long (the 3-4-5 triangle).
    const moved = { nodes: [revision1.nodes[0], { id: "N2", x: 3, y: 0, z: 4 }, revision1.nodes[2]], members: revision1.members };
    const [x, y, z] = resolveAnchor({ kind: "member", id: "BC-1", point: [1.5, 0, 0] }, moved)!;
    // By hand: the projection of (1.5,0,0) on the unit axis (0.6,0,0.8) is 0.9 m along it: (0.54, 0, 0.72).
    expect(x).toBeCloseTo(0.54, 12);
    expect(y).toBe(0);
    expect(z).toBeCloseTo(0.72, 12);
    expect(resolveAnchor({ kind: "member", id: "D-2", point: [0.75, 0.75, 1] }, revision2)).toBeNull();
  });
});

describe("nearestOnSegment", () => {
  it("projects onto the segment and stops at its ends (vector projection, common practice)", () => {
    expect(nearestOnSegment([1, 5, 0], [0, 0, 0], [2, 0, 0])).toEqual([1, 0, 0]);
    expect(nearestOnSegment([-3, 1, 0], [0, 0, 0], [2, 0, 0])).toEqual([0, 0, 0]);
    expect(nearestOnSegment([9, 1, 1], [0, 0, 0], [2, 0, 0])).toEqual([2, 0, 0]);
    expect(nearestOnSegment([4, 4, 4], [1, 1, 1], [1, 1, 1])).toEqual([1, 1, 1]);
  });
});

describe("roundToMillimetre", () => {
  it("gives back the model's coordinates from the viewer's Float32 ones", () => {
    // Math.fround(1.8) is the Float32 nearest 1.8 (IEEE 754 single precision): 1.7999999523162842.
    expect(roundToMillimetre([Math.fround(24), Math.fround(18), Math.fround(1.8)])).toEqual([24, 18, 1.8]);
    expect(roundToMillimetre([7.49962, -0.0126, 2.0006])).toEqual([7.5, -0.013, 2.001]);
  });
});

describe("anchorLabel", () => {
  it("names the anchor", () => {
    expect(anchorLabel({ kind: "member", id: "BC-1" })).toBe("member BC-1");
    expect(anchorLabel({ kind: "point", point: [3, 4.5, 9] })).toBe("point 3.0, 4.5, 9.0");
    expect(anchorLabel({ kind: "member", id: "BC-1", point: [0.6, 0, 0] })).toBe("member BC-1 at 0.6, 0.0, 0.0");
  });
});
