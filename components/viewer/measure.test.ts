import { describe, expect, it } from "vitest";
import { distanceBetween, formatMetres } from "./measure";

describe("measuring between two points", () => {
  it("gives the straight-line distance and its parts", () => {
    // A 3-4-5 right triangle (Pythagoras) and a 1-2-2 / 3 box diagonal: exact values to check against.
    expect(distanceBetween([0, 0, 0], [3, 4, 0])).toEqual({ distance: 5, dx: 3, dy: 4, dz: 0 });
    expect(distanceBetween([1, 1, 1], [2, 3, 3]).distance).toBe(3);
    expect(distanceBetween([2, 3, 3], [1, 1, 1])).toMatchObject({ distance: 3, dx: -1, dy: -2, dz: -2 });
  });

  it("prints metres to the centimetre, whatever float the coordinates came as", () => {
    expect(formatMetres(Math.fround(1.8))).toBe("1.80 m");
    expect(formatMetres(4.2426406871)).toBe("4.24 m");
    expect(formatMetres(-0.001)).toBe("0.00 m");
    expect(formatMetres(48)).toBe("48.00 m");
  });
});
