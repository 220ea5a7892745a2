import { describe, expect, it } from "vitest";
import { anchorLabel, resolveAnchor } from "./anchors";

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

describe("anchorLabel", () => {
  it("names the anchor", () => {
    expect(anchorLabel({ kind: "member", id: "BC-1" })).toBe("member BC-1");
    expect(anchorLabel({ kind: "point", point: [3, 4.5, 9] })).toBe("point 3.0, 4.5, 9.0");
  });
});
