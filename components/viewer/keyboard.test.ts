// Keyboard stepping through the drawn members. The expectations are worked by hand from the masks below.
import { describe, expect, it } from "vitest";
import { stepVisibleMember, viewerKeyAction } from "./keyboard";

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
