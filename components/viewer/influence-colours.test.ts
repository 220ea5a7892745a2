import { describe, expect, it } from "vitest";
import { formatInfluence, influenceColour, influenceColours, influenceLegend } from "./influence-colours";

// Palette values copied from the product glossary ("Words and colours on screen"): tension #0f766e,
// compression #c2410c, zero-force slate #94a3b8. Sign convention from the design notes: axial force positive in
// tension, so a positive influence value means a downward load at that node puts the member in tension.
const TENSION = [0x0f / 255, 0x76 / 255, 0x6e / 255];
const COMPRESSION = [0xc2 / 255, 0x41 / 255, 0x0c / 255];
const SLATE = [0x94 / 255, 0xa3 / 255, 0xb8 / 255];
// Midpoint of a linear blend, worked by hand: (a + b) / 2 per channel.
const half = (a: number[], b: number[]) => a.map((c, k) => (c + b[k]) / 2);

const expectRgb = (actual: ArrayLike<number>, expected: number[]) => Array.from(actual).forEach((c, k) => expect(c).toBeCloseTo(expected[k], 5));

describe("influence colour scale", () => {
  it("puts the tension colour at +max, the compression colour at −max and slate at zero", () => {
    expectRgb(influenceColour(0.8, 0.8), TENSION);
    expectRgb(influenceColour(-0.8, 0.8), COMPRESSION);
    expectRgb(influenceColour(0, 0.8), SLATE);
  });

  it("is halfway between slate and the sign's colour at half the scale", () => {
    expectRgb(influenceColour(0.4, 0.8), half(SLATE, TENSION));
    expectRgb(influenceColour(-0.4, 0.8), half(SLATE, COMPRESSION));
  });

  it("draws every node slate when the member takes no force from any node", () => {
    expectRgb(influenceColour(0, 0), SLATE);
    expectRgb(influenceColours([{ node: "T1", value: 0 }, { node: "T2", value: 0 }]).subarray(3, 6), SLATE);
  });

  it("scales symmetrically on the largest |value|, so equal colours mean equal kN/kN of either sign", () => {
    const colours = influenceColours([
      { node: "T1", value: 0.25 },
      { node: "T2", value: -0.5 },
      { node: "T3", value: 0 },
    ]);
    expectRgb(colours.subarray(0, 3), half(SLATE, TENSION));
    expectRgb(colours.subarray(3, 6), COMPRESSION);
    expectRgb(colours.subarray(6, 9), SLATE);
  });
});

describe("influence legend", () => {
  it("names the member and unit and gives the range of the values", () => {
    const legend = influenceLegend("M12", [
      { node: "T1", value: 0.31 },
      { node: "T2", value: -0.62 },
      { node: "T3", value: 0.05 },
    ]);
    expect(legend.title).toBe("Force in M12 per 1 kN downward at each top node, kN/kN");
    expect(legend.min).toBe(-0.62);
    expect(legend.max).toBe(0.31);
    expect(legend.scaleMax).toBe(0.62);
    expect([legend.fromColour, legend.midColour, legend.toColour]).toEqual(["#c2410c", "#94a3b8", "#0f766e"]);
  });

  it("formats values with a real minus sign and never shows −0.000", () => {
    expect(formatInfluence(-0.62)).toBe("−0.620");
    expect(formatInfluence(0.31)).toBe("0.310");
    expect(formatInfluence(-0.00001)).toBe("0.000");
  });
});
