import { describe, expect, it } from "vitest";
import { packBits, VERDICT_CODES } from "@/lib/models/result-columns";
import { computeAppearance, countStates, deltaForceColour, divergingColour, forceStates, hexToRgb, memberRadius, STATE_CODE, type ResultColumnsView } from "./colouring";
import type { MemberVerdict } from "./types";

// Palette values copied from the product glossary ("Words and colours on screen"): tension #0f766e,
// compression #c2410c, zero-force #94a3b8. Sign convention from the design notes: axial force positive in tension.
const TENSION = [0x0f / 255, 0x76 / 255, 0x6e / 255];
const COMPRESSION = [0xc2 / 255, 0x41 / 255, 0x0c / 255];
const ZERO = [0x94 / 255, 0xa3 / 255, 0xb8 / 255];

const ids = ["A", "B", "C", "D"];
type Review = Record<string, { verdict: MemberVerdict; utilisation: number | null }>;
/** A result's columns in member order, as the columns endpoint sends them. */
function columnsOf(forces: Record<string, number>, zero: string[], { zeroInAll = [], review }: { zeroInAll?: string[]; review?: Review } = {}): ResultColumnsView {
  return {
    memberCount: ids.length,
    forces: Float32Array.from(ids.map((id) => forces[id])),
    zero: packBits(ids.length, (k) => zero.includes(ids[k])),
    zeroInAll: packBits(ids.length, (k) => zeroInAll.includes(ids[k])),
    utilisation: Float32Array.from(ids.map((id) => review?.[id]?.utilisation ?? Number.NaN)),
    verdicts: Uint8Array.from(ids.map((id) => (review?.[id] ? VERDICT_CODES.indexOf(review[id].verdict) + 1 : 0))),
    hasReview: review !== undefined,
  };
}
const result = columnsOf({ A: 100, B: -50, C: 0, D: 2 }, ["C"]);
const colourOf = (colours: Float32Array, k: number) => Array.from(colours.slice(k * 3, k * 3 + 3));

describe("force state", () => {
  it("reads tension as positive and takes zero-force from the stored list", () => {
    const states = forceStates(result);
    expect(Array.from(states)).toEqual([STATE_CODE.tension, STATE_CODE.compression, STATE_CODE["zero-force"], STATE_CODE.tension]);
    expect(countStates(states)).toEqual({ tension: 2, compression: 1, "zero-force": 1 });
    expect(countStates(states, new Uint8Array([1, 0, 1, 1]))).toEqual({ tension: 2, compression: 0, "zero-force": 1 });
  });

  it("colours members with the palette, zero-force thin and translucent", () => {
    const look = computeAppearance({ columns: result, resultLabel: "LC1", mode: "forceState", unitLength: 1, lowForceThreshold: 0 });
    colourOf(look.colours, 0).forEach((c, a) => expect(c).toBeCloseTo(TENSION[a], 5));
    colourOf(look.colours, 1).forEach((c, a) => expect(c).toBeCloseTo(COMPRESSION[a], 5));
    colourOf(look.colours, 2).forEach((c, a) => expect(c).toBeCloseTo(ZERO[a], 5));
    expect(Array.from(look.translucent)).toEqual([0, 0, 1, 0]);
    expect(look.legend.counts).toEqual({ tension: 2, compression: 1, "zero-force": 1 });
    expect(look.legend.entries.map((e) => [e.key, e.count])).toEqual([["tension", 2], ["compression", 1], ["zero-force", 1]]);
  });

  it("counts only the members the filters let through, and says how many of all those are (issue 17 item 9)", () => {
    // Members A (tension) and C (zero-force) hidden by a filter: B (compression) and D (tension) remain.
    const shown = Uint8Array.from([0, 1, 0, 1]);
    const look = computeAppearance({ columns: result, resultLabel: "LC1", mode: "forceState", unitLength: 1, lowForceThreshold: 0, shown });
    expect(look.legend.counts).toEqual({ tension: 1, compression: 1, "zero-force": 0 });
    expect(look.legend.entries.map((e) => [e.key, e.count])).toEqual([["tension", 1], ["compression", 1], ["zero-force", 0]]);
    expect(look.legend.members).toEqual({ counted: 2, total: 4 });
    // Hidden members keep their colour, so showing them again needs no new colouring.
    colourOf(look.colours, 0).forEach((c, a) => expect(c).toBeCloseTo(TENSION[a], 5));
    const all = computeAppearance({ columns: result, resultLabel: "LC1", mode: "forceState", unitLength: 1, lowForceThreshold: 0 });
    expect(all.legend.members).toEqual({ counted: 4, total: 4 });
  });

  it("makes thickness grow with |N| so the state reads without colour", () => {
    const look = computeAppearance({ columns: result, resultLabel: "LC1", mode: "forceState", unitLength: 1, lowForceThreshold: 0 });
    const [a, b, c, d] = Array.from(look.radii);
    expect(a).toBeGreaterThan(b);
    expect(b).toBeGreaterThan(d);
    expect(d).toBeGreaterThan(c);
    expect(memberRadius(-100, 100, false, 2)).toBe(memberRadius(100, 100, false, 2));
  });

  it("pales low-force members towards white and counts them apart", () => {
    const look = computeAppearance({ columns: result, resultLabel: "LC1", mode: "forceState", unitLength: 1, lowForceThreshold: 5 });
    const pale = colourOf(look.colours, 3);
    pale.forEach((c, a) => expect(c).toBeGreaterThan(TENSION[a]));
    const entry = look.legend.entries.find((e) => e.key === "low-tension");
    expect(entry?.count).toBe(1);
    expect(look.legend.entries.find((e) => e.key === "tension")?.count).toBe(1);
    // The legend's state counts stay the plain tension / compression / zero-force split.
    expect(look.legend.counts).toEqual({ tension: 2, compression: 1, "zero-force": 1 });
  });
});

describe("other colourings", () => {
  it("maps force magnitude on a diverging scale symmetric about zero, in kN", () => {
    divergingColour(100, 100).forEach((c, a) => expect(c).toBeCloseTo(hexToRgb("#0f766e")[a], 6));
    divergingColour(-100, 100).forEach((c, a) => expect(c).toBeCloseTo(hexToRgb("#c2410c")[a], 6));
    // Half the largest force sits halfway between the neutral and the sign colour.
    const neutral = hexToRgb("#f1f5f9");
    divergingColour(50, 100).forEach((c, a) => expect(c).toBeCloseTo((neutral[a] + TENSION[a]) / 2, 6));
    const look = computeAppearance({ columns: result, resultLabel: "LC1", mode: "magnitude", unitLength: 1, lowForceThreshold: 0 });
    expect(look.legend.scale).toMatchObject({ min: -100, max: 100, unit: "kN" });
  });

  it("marks members that are zero in every result", () => {
    const look = computeAppearance({ columns: columnsOf({ A: 100, B: -50, C: 0, D: 2 }, ["C"], { zeroInAll: ["C", "D"] }), resultLabel: "LC1", mode: "zeroInAll", unitLength: 1, lowForceThreshold: 0 });
    expect(Array.from(look.translucent)).toEqual([0, 0, 1, 1]);
    expect(look.legend.entries.find((e) => e.key === "always")?.count).toBe(2);
  });

  it("colours verdicts and utilisation from the review", () => {
    const review = {
      A: { verdict: "load-bearing" as const, utilisation: 1.2 },
      B: { verdict: "load-bearing" as const, utilisation: 0.95 },
      C: { verdict: "idle" as const, utilisation: 0 },
      D: { verdict: "bracing" as const, utilisation: null },
    };
    const reviewed = columnsOf({ A: 100, B: -50, C: 0, D: 2 }, ["C"], { review });
    const verdicts = computeAppearance({ columns: reviewed, resultLabel: "LC1", mode: "verdict", unitLength: 1, lowForceThreshold: 0 });
    expect(Object.fromEntries(verdicts.legend.entries.map((e) => [e.key, e.count]))).toEqual({ "load-bearing": 2, stabilising: 0, bracing: 1, idle: 1 });
    const util = computeAppearance({ columns: reviewed, resultLabel: "LC1", mode: "utilisation", unitLength: 1, lowForceThreshold: 0 });
    expect(Object.fromEntries(util.legend.entries.map((e) => [e.key, e.count]))).toEqual({ ok: 1, high: 1, over: 1, none: 1 });
  });

  it("shows which members changed state between two results", () => {
    const other = columnsOf({ A: 80, B: 10, C: -3, D: 2 }, []);
    const look = computeAppearance({ columns: result, resultLabel: "LC1", mode: "compare", unitLength: 1, lowForceThreshold: 0, compareColumns: other, compareLabel: "LC2" });
    // B: tension → compression, C: compression → zero; A and D unchanged.
    expect(Object.fromEntries(look.legend.entries.map((e) => [e.key, e.count]))).toEqual({ "to-tension": 0, "to-compression": 1, "to-zero-force": 1, same: 2 });
    expect(Array.from(look.translucent)).toEqual([1, 0, 0, 1]);
  });

  it("names the change it shows, from the compared result to the chosen one, and its largest change of force", () => {
    const other = columnsOf({ A: 80, B: 10, C: -3, D: 2 }, []);
    const look = computeAppearance({ columns: result, resultLabel: "LC1", mode: "compare", unitLength: 1, lowForceThreshold: 0, compareColumns: other, compareLabel: "LC2", memberIds: ids });
    expect(look.legend.title).toBe("Change from LC2 to LC1");
    // N(LC1) − N(LC2): A +20, B −60, C +3, D 0 (kN), so B changes most.
    expect(look.legend.note).toBe("Largest change of force: B, −60.0 kN");
  });
});

describe("ΔN between two results (compare mode's force scale)", () => {
  // N(LC1) − N(LC2) by hand: A 100 − 80 = +20, B −50 − 10 = −60, C 0 − (−3) = +3, D 2 − 2 = 0 kN.
  const other = columnsOf({ A: 80, B: 10, C: -3, D: 2 }, []);
  const look = computeAppearance({ columns: result, resultLabel: "LC1", mode: "deltaForce", unitLength: 1, lowForceThreshold: 0, compareColumns: other, compareLabel: "LC2", memberIds: ids });
  // The scale's colours (ours, components/viewer/config.ts deltaForceScale) and the neutral tint #f1f5f9.
  const RISE = [0x1e / 255, 0x40 / 255, 0xaf / 255];
  const FALL = [0x92 / 255, 0x40 / 255, 0x0e / 255];
  const NEUTRAL = [0xf1 / 255, 0xf5 / 255, 0xf9 / 255];

  it("draws the largest fall in the full fall colour, no change in the neutral tint, and a rise part of the way", () => {
    colourOf(look.colours, 1).forEach((c, a) => expect(c).toBeCloseTo(FALL[a], 5));
    colourOf(look.colours, 3).forEach((c, a) => expect(c).toBeCloseTo(NEUTRAL[a], 5));
    // A: +20 of 60 kN, a third of the way from the neutral tint to the rise colour.
    colourOf(look.colours, 0).forEach((c, a) => expect(c).toBeCloseTo(NEUTRAL[a] + (RISE[a] - NEUTRAL[a]) / 3, 5));
    expect(Array.from(look.translucent)).toEqual([0, 0, 0, 1]);
  });

  it("gives the legend the scale's values, ±60 kN about 0, and counts each side", () => {
    expect(look.legend.title).toBe("ΔN from LC2 to LC1");
    expect(look.legend.scale).toMatchObject({ min: -60, max: 60, unit: "kN", fromColour: "#92400e", midColour: "#f1f5f9", toColour: "#1e40af" });
    expect(Object.fromEntries(look.legend.entries.map((e) => [e.key, e.count]))).toEqual({ rise: 2, fall: 1, same: 1 });
    expect(look.legend.note).toBe("Largest change of force: B, −60.0 kN");
  });

  it("takes Float32 noise for no change (design.md's zero-force rule applied to ΔN)", () => {
    expect(deltaForceColour(1e-12, 0)).toEqual(hexToRgb("#f1f5f9"));
    expect(deltaForceColour(5e-5, 100)).toEqual(hexToRgb("#f1f5f9"));
    deltaForceColour(-100, 100).forEach((c, a) => expect(c).toBeCloseTo(FALL[a], 9));
  });
});
