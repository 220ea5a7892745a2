// Keyboard stepping through the drawn members. The expectations are worked by hand from the masks below.
import { describe, expect, it } from "vitest";
import { isInView, memberMidpoint, stepVisibleMember, viewerKeyAction } from "./keyboard";

describe("viewerKeyAction", () => {
  it("maps the arrow keys to steps and Escape to clearing, and leaves other keys alone", () => {
    expect(viewerKeyAction("ArrowRight")).toEqual({ step: 1 });
    expect(viewerKeyAction("ArrowDown")).toEqual({ step: 1 });
    expect(viewerKeyAction("ArrowLeft")).toEqual({ step: -1 });
    expect(viewerKeyAction("ArrowUp")).toEqual({ step: -1 });
    expect(viewerKeyAction("Escape")).toEqual({ clear: true });
    expect(viewerKeyAction("Tab")).toBeNull();
    expect(viewerKeyAction("a")).toBeNull();
  });
});

describe("stepVisibleMember", () => {
  const mask = Uint8Array.from([0, 1, 0, 1, 1, 0]);

  it("starts at the first drawn member going forward and the last going back", () => {
    expect(stepVisibleMember(6, mask, -1, 1)).toBe(1);
    expect(stepVisibleMember(6, mask, -1, -1)).toBe(4);
  });

  it("skips members the filters hide, and wraps at both ends", () => {
    expect(stepVisibleMember(6, mask, 1, 1)).toBe(3);
    expect(stepVisibleMember(6, mask, 4, 1)).toBe(1);
    expect(stepVisibleMember(6, mask, 1, -1)).toBe(4);
    expect(stepVisibleMember(6, mask, 3, -1)).toBe(1);
  });

  it("moves off a selected member that is hidden now", () => {
    expect(stepVisibleMember(6, mask, 2, 1)).toBe(3);
    expect(stepVisibleMember(6, mask, 2, -1)).toBe(1);
  });

  it("walks every member when no mask is given, and finds nothing when all are hidden", () => {
    expect(stepVisibleMember(3, null, 2, 1)).toBe(0);
    expect(stepVisibleMember(3, new Uint8Array(3), -1, 1)).toBe(-1);
    expect(stepVisibleMember(0, null, -1, 1)).toBe(-1);
  });
});

describe("following the member stepped to", () => {
  it("takes a member's midpoint from its two end nodes", () => {
    // Nodes (0,0,0), (2,4,6), (-2,0,1); member 0 runs 0→1, member 1 runs 2→1.
    const positions = Float32Array.from([0, 0, 0, 2, 4, 6, -2, 0, 1]);
    const ends = Int32Array.from([0, 1, 2, 1]);
    expect(memberMidpoint(positions, ends, 0)).toEqual([1, 2, 3]);
    expect(memberMidpoint(positions, ends, 1)).toEqual([0, 2, 3.5]);
  });

  it("counts a point in the margin, outside the canvas or behind the camera as off screen", () => {
    // A canvas 200 x 100 at (10, 20); a 5 % margin keeps 10 px in from the sides and 5 px from top and bottom.
    const area = { left: 10, top: 20, width: 200, height: 100 };
    expect(isInView({ x: 110, y: 70 }, area, 0.05)).toBe(true);
    expect(isInView({ x: 20, y: 25 }, area, 0.05)).toBe(true);
    expect(isInView({ x: 19, y: 70 }, area, 0.05)).toBe(false);
    expect(isInView({ x: 201, y: 70 }, area, 0.05)).toBe(false);
    expect(isInView({ x: 110, y: 24 }, area, 0.05)).toBe(false);
    expect(isInView({ x: 110, y: 116 }, area, 0.05)).toBe(false);
    expect(isInView({ x: -500, y: 70 }, area, 0.05)).toBe(false);
    expect(isInView(null, area, 0.05)).toBe(false);
  });
});
