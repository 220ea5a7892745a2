import { describe, expect, it } from "vitest";
import { closestSegmentBox, closestSegmentSegment, type OrientedBox } from "./distance";

// All expected values are hand-computed below (elementary vector geometry; no outside library needed).

describe("closestSegmentSegment", () => {
  it("finds the common perpendicular of two skew perpendicular segments", () => {
    // x-axis segment (0,0,0)-(4,0,0) and a y-direction segment at x = 2, z = 0.5: the common perpendicular is
    // vertical through (2,0,·), length 0.5; s = 2/4 = 0.5, t = 2/4 = 0.5.
    const c = closestSegmentSegment([0, 0, 0], [4, 0, 0], [2, -2, 0.5], [2, 2, 0.5]);
    expect(c.distance).toBeCloseTo(0.5, 12);
    expect(c.s).toBeCloseTo(0.5, 12);
    expect(c.t).toBeCloseTo(0.5, 12);
    expect(c.c1).toEqual([2, 0, 0]);
  });

  it("clamps to the end of the first segment when the lines meet beyond it (skew)", () => {
    // Lines x-axis and (2, t, 1): unclamped closest point on the x-axis would be s = 2 (x = 2), outside [0,1];
    // clamped s = 1 gives (1,0,0), whose nearest point on the second segment is (2,0,1): distance √(1² + 1²) = √2.
    const c = closestSegmentSegment([0, 0, 0], [1, 0, 0], [2, -1, 1], [2, 1, 1]);
    expect(c.distance).toBeCloseTo(Math.SQRT2, 12);
    expect(c.c1).toEqual([1, 0, 0]);
    expect(c.c2[0]).toBeCloseTo(2, 12);
    expect(c.c2[1]).toBeCloseTo(0, 12);
  });

  it("measures a skew pair whose closest points are inside both segments", () => {
    // Second segment (0,1,1)-(1,0,1): points (t, 1 − t, 1); squared distance to (s,0,0) = (t − s)² + (1 − t)² + 1,
    // smallest at s = t = 1: distance 1, at (1,0,0) and (1,0,1).
    const c = closestSegmentSegment([0, 0, 0], [1, 0, 0], [0, 1, 1], [1, 0, 1]);
    expect(c.distance).toBeCloseTo(1, 12);
    expect(c.c2[0]).toBeCloseTo(1, 12);
  });

  it("handles parallel segments that overlap, overlap partly, and do not overlap", () => {
    // Overlapping in x (1..3 within 0..4), offset 0.3 in y: distance 0.3.
    expect(closestSegmentSegment([0, 0, 0], [4, 0, 0], [1, 0.3, 0], [3, 0.3, 0]).distance).toBeCloseTo(0.3, 12);
    // Partly overlapping (x 3..6 vs 0..4), offset 0.4 in z: distance 0.4.
    expect(closestSegmentSegment([0, 0, 0], [4, 0, 0], [3, 0, 0.4], [6, 0, 0.4]).distance).toBeCloseTo(0.4, 12);
    // Disjoint in x: nearest are the ends (4,0,0) and (5,0,0.3): √(1² + 0.3²) = √1.09 = 1.0440306508910550.
    expect(closestSegmentSegment([0, 0, 0], [4, 0, 0], [5, 0, 0.3], [7, 0, 0.3]).distance).toBeCloseTo(1.044030650891055, 12);
    // Antiparallel direction gives the same answer.
    expect(closestSegmentSegment([0, 0, 0], [4, 0, 0], [7, 0, 0.3], [5, 0, 0.3]).distance).toBeCloseTo(1.044030650891055, 12);
  });

  it("measures touching ends end to end", () => {
    // Collinear, end (1,0,0) to start (1.3,0,0): 0.3. L-shaped, end (1,0,0) to start (1,0,0.25): 0.25.
    expect(closestSegmentSegment([0, 0, 0], [1, 0, 0], [1.3, 0, 0], [2, 0, 0]).distance).toBeCloseTo(0.3, 12);
    const l = closestSegmentSegment([0, 0, 0], [1, 0, 0], [1, 0, 0.25], [1, 0, 2]);
    expect(l.distance).toBeCloseTo(0.25, 12);
    expect([l.s, l.t]).toEqual([1, 0]);
  });

  it("reports zero for crossing segments", () => {
    expect(closestSegmentSegment([0, 0, 0], [2, 0, 0], [1, -1, 0], [1, 1, 0]).distance).toBeCloseTo(0, 12);
  });
});

describe("closestSegmentBox", () => {
  // Box along x, centre origin, half extents 2 × 0.3 × 0.1 (a 0.6 × 0.2 duct section, 4 m long).
  const box: OrientedBox = { centre: [0, 0, 0], axes: [[1, 0, 0], [0, 1, 0], [0, 0, 1]], half: [2, 0.3, 0.1] };

  it("measures a segment passing above the box", () => {
    // Line along y at z = 0.25 over the top face (z = 0.1): distance 0.15, nearest box point on the top face.
    const c = closestSegmentBox([0, -2, 0.25], [0, 2, 0.25], box);
    expect(c.signedDistance).toBeCloseTo(0.15, 12);
    expect(c.onBox[2]).toBeCloseTo(0.1, 12);
  });

  it("measures past an edge", () => {
    // Segment along z at x = 0, y = 0.7, from z = 0.5 to 1: nearest box point is the edge (y 0.3, z 0.1):
    // √(0.4² + 0.4²) = 0.565685424949238.
    const c = closestSegmentBox([0, 0.7, 0.5], [0, 0.7, 1], box);
    expect(c.signedDistance).toBeCloseTo(0.565685424949238, 10);
  });

  it("returns the depth inside as a negative distance", () => {
    // Along y at z = 0.05: inside the box, 0.05 below the top face and 0.15 above the bottom: depth −0.05.
    expect(closestSegmentBox([0, -2, 0.05], [0, 2, 0.05], box).signedDistance).toBeCloseTo(-0.05, 10);
  });

  it("handles a segment parallel to the box axis", () => {
    // Along x at y = 0, z = 0.4, beyond the end face (x 2): from x = 3 to 5; nearest the corner region:
    // local point (3,0,0.4) to box: dx = 1, dz = 0.3 → √1.09.
    expect(closestSegmentBox([3, 0, 0.4], [5, 0, 0.4], box).signedDistance).toBeCloseTo(1.044030650891055, 10);
  });
});
