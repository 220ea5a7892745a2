// Snow drift at a step (EN 1991-1-3:2003 5.3.6, Figure 5.7) and wind zones on a flat roof (EN 1991-1-4:2005 7.2.3,
// Figure 7.6, Table 7.2 sharp eaves), checked by hand: the total on the roof is each load shape integrated over the
// plan (pressure × zone area). The clause values are quoted from memory (see climatic-loads.ts); the arithmetic of
// each expected total is written out beside it.
import { describe, expect, it } from "vitest";
import { analyzeModel } from "./analyze";
import { snowDriftShape, windZoneLoads } from "./climatic-loads";
import { generateRoof, roofParamsSchema } from "./generator";

// 12 m along x (4 bays), 9 m along y (3 bays), module 3 m; balanced snow s = 0.8 kN/m2, so sk = s / μ1 = 1.0 kN/m2
const base = { spanX: 12, spanY: 9, module: 3, depth: 1.5, snow: 0.8 } as const;
const grid = { nx: 4, ny: 3, a: 3 };
const total = (loads: { fz: number }[]) => loads.reduce((sum, l) => sum + l.fz, 0);
const at = (loads: { node: string; fz: number }[], node: string) => loads.find((l) => l.node === node)!.fz;

describe("snow drift at a step (EN 1991-1-3 5.3.6)", () => {
  it("μw capped by γh/sk, ls raised to 5 m: total = sk·B·(μ1·L + (μ2 − μ1)·ls/2)", () => {
    // h = 2 m, b1 = 10 m, b2 = 12 m: (b1 + b2)/2h = 22/4 = 5.5; γh/sk = 2·2/1 = 4 → μw = 4 (also the upper bound 4)
    // ls = 2h = 4 m → 5 m (lower bound). Total = 1.0 × 9 × (0.8 × 12 + (4 − 0.8) × 5 / 2) = 9 × 17.6 = 158.4 kN
    const shape = snowDriftShape(0.8, 2, 10, 12);
    expect(shape.sk).toBeCloseTo(1, 12);
    expect(shape.muwGeometric).toBeCloseTo(5.5, 12);
    expect(shape.muwHeightCap).toBeCloseTo(4, 12);
    expect(shape.mu2).toBeCloseTo(4, 12);
    expect(shape.ls).toBe(5);
    const model = generateRoof({ ...base, snowDriftEdge: "west", stepHeight: 2, upperRoofWidth: 10 });
    const drift = model.loadCases.find((c) => c.id === "snow-drift")!;
    expect(drift.category).toBe("snow");
    expect(total(drift.nodalLoads)).toBeCloseTo(-158.4, 9);
    // corner T-0-0, tributary 1.5 × 1.5 m at the step: ∫0^1.5 (0.8 + 3.2·(1 − u/5)) du = 1.2 + 3.2 × (1.5 − 1.5²/10)
    // = 1.2 + 4.08 = 5.28 m, × 1.5 m × sk = 7.92 kN; far corner T-4-0 (u from 10.5 to 12, beyond ls): 0.8 × 2.25 = 1.8 kN
    expect(at(drift.nodalLoads, "T-0-0")).toBeCloseTo(-7.92, 12);
    expect(at(drift.nodalLoads, "T-4-0")).toBeCloseTo(-1.8, 12);
    // the drift leads its own combination, 1.35G + 1.5S (EN 1990 (6.10), Table A1.2(B))
    expect(model.combinations.find((c) => c.id === "ULS-snow-drift")!.factors).toEqual({ dead: 1.35, services: 1.35, "snow-drift": 1.5 });
    expect(analyzeModel(model).status).toBe("ok");
  });

  it("a tall step: μw from the widths, ls = 2h; and on the north edge the drift runs along y", () => {
    // h = 5 m, b1 = 20 m, b2 = 12 m: μw = 32/10 = 3.2 (γh/sk = 10 does not bind); ls = 10 m
    // total = 9 × (0.8 × 12 + 2.4 × 10/2) = 9 × 21.6 = 194.4 kN
    const model = generateRoof({ ...base, snowDriftEdge: "east", stepHeight: 5, upperRoofWidth: 20 });
    expect(total(model.loadCases.find((c) => c.id === "snow-drift")!.nodalLoads)).toBeCloseTo(-194.4, 9);
    // north edge: b2 = 9 m (the roof's depth away from that edge), B = 12 m. h = 5, b1 = 20: μw = 29/10 = 2.9, ls 10 m
    // > 9 m, so the drift is cut at the far edge: ∫0^9 (0.8 + 2.1(1 − u/10)) du = 7.2 + 2.1 × (9 − 81/20) = 17.595
    // total = 12 × 17.595 = 211.14 kN
    const north = generateRoof({ ...base, snowDriftEdge: "north", stepHeight: 5, upperRoofWidth: 20 });
    expect(total(north.loadCases.find((c) => c.id === "snow-drift")!.nodalLoads)).toBeCloseTo(-211.14, 9);
  });

  it("a low step on a snowy site: μw raised to its lower bound 0.8, so the drift is the balanced snow", () => {
    // s = 4 → sk = 5 kN/m2; h = 1 m: γh/sk = 0.4 → bounded up to 0.8 = μ1: total = 4 × 12 × 9 = 432 kN
    const model = generateRoof({ ...base, snow: 4, snowDriftEdge: "south", stepHeight: 1, upperRoofWidth: 10 });
    expect(total(model.loadCases.find((c) => c.id === "snow-drift")!.nodalLoads)).toBeCloseTo(-432, 9);
  });
});

describe("wind pressure and suction zones on a flat roof (EN 1991-1-4 7.2.3)", () => {
  it("wind from the west, e = b = 9 m: zone areas and the total uplift = Σ qp·|cpe|·area", () => {
    // b = 9 (across the wind), d = 12, h = 10: e = min(9, 20) = 9; e/10 = 0.9, e/4 = 2.25, e/2 = 4.5
    // F = 2 × 0.9 × 2.25 = 4.05 m2, G = 0.9 × (9 − 4.5) = 4.05, H = (4.5 − 0.9) × 9 = 32.4, I = (12 − 4.5) × 9 = 67.5
    // (sum 108 = 12 × 9). qp = 1: uplift = 1.8·4.05 + 1.2·4.05 + 0.7·32.4 + 0.2·67.5 = 7.29 + 4.86 + 22.68 + 13.5 = 48.33
    const uplift = windZoneLoads(grid, "west", 1, 10, "suction");
    expect(total(uplift)).toBeCloseTo(48.33, 9);
    // zone I in pressure: 7.29 + 4.86 + 22.68 − 13.5 = 21.33 kN still up in total, but down on zone I
    const downward = windZoneLoads(grid, "west", 1, 10, "pressure");
    expect(total(downward)).toBeCloseTo(21.33, 9);
    expect(at(downward, "T-4-1")).toBeCloseTo(-0.2 * 1.5 * 3, 12); // inside zone I: 0.2 × 4.5 m2, downward
    // corner T-0-0 (tributary 1.5 × 1.5): F over 0.9 × 1.5 = 1.35 m2 → 2.43 kN; H over 0.6 × 1.5 = 0.9 m2 → 0.63 kN
    expect(at(uplift, "T-0-0")).toBeCloseTo(3.06, 12);
    // the mirror image from the east
    expect(at(windZoneLoads(grid, "east", 1, 10, "suction"), "T-4-0")).toBeCloseTo(3.06, 12);
  });

  it("wind from the south, e = b = 12 m; and a low roof, e = 2h", () => {
    // b = 12, d = 9, e = 12: F 2 × 1.2 × 3 = 7.2, G 1.2 × 6 = 7.2, H 4.8 × 12 = 57.6, I 3 × 12 = 36 (sum 108)
    // uplift = 1.8·7.2 + 1.2·7.2 + 0.7·57.6 + 0.2·36 = 12.96 + 8.64 + 40.32 + 7.2 = 69.12
    expect(total(windZoneLoads(grid, "south", 1, 10, "suction"))).toBeCloseTo(69.12, 9);
    // from the west with h = 3: e = min(9, 6) = 6; F 2 × 0.6 × 1.5 = 1.8, G 0.6 × 6 = 3.6, H 2.4 × 9 = 21.6, I 9 × 9 = 81
    // qp = 0.9: 0.9 × (1.8·1.8 + 1.2·3.6 + 0.7·21.6 + 0.2·81) = 0.9 × (3.24 + 4.32 + 15.12 + 16.2) = 0.9 × 38.88 = 34.992
    expect(total(windZoneLoads(grid, "west", 0.9, 3, "suction"))).toBeCloseTo(34.992, 9);
  });

  it("the generator adds an uplift and a downward case per wind direction, each leading its combination", () => {
    const model = generateRoof({ ...base, windZones: true, windPeakPressure: 1, roofHeight: 10 });
    const ids = model.loadCases.filter((c) => c.id.startsWith("wind-") && c.id !== "wind-uplift").map((c) => c.id);
    expect(ids).toEqual(["west", "east", "south", "north"].flatMap((d) => [`wind-${d}-uplift`, `wind-${d}-downward`]));
    expect(total(model.loadCases.find((c) => c.id === "wind-north-uplift")!.nodalLoads)).toBeCloseTo(69.12, 9);
    const byId = new Map(model.combinations.map((c) => [c.id, c.factors]));
    // EN 1990 Table A1.2(B): uplift with G favourable (γG,inf 1.0, services not relied upon); downward with snow
    // accompanying (ψ0 = 0.5, Table A1.1)
    expect(byId.get("ULS-wind-west-uplift")).toEqual({ dead: 1.0, "wind-west-uplift": 1.5 });
    expect(byId.get("ULS-wind-west-downward")).toEqual({ dead: 1.35, services: 1.35, "wind-west-downward": 1.5, snow: 0.75 });
    const paired = new Map(generateRoof({ ...base, windZones: true, windPeakPressure: 1, roofHeight: 10, combinationRule: "6.10a/6.10b" }).combinations.map((c) => [c.id, c.factors]));
    // (6.10a): ψ0 wind 0.6 → 1.5 × 0.6 = 0.9; (6.10b): ξ·γG = 0.85 × 1.35
    expect(paired.get("ULS-wind-east-downward-a")).toEqual({ dead: 1.35, services: 1.35, "wind-east-downward": 0.9, snow: 0.75 });
    expect(paired.get("ULS-wind-east-downward-b")!.dead).toBeCloseTo(1.1475, 12);
    expect(analyzeModel(model).status).toBe("ok");
  });

  it("refuses missing inputs, and drift or zones with ASCE 7-22, naming each field", () => {
    const paths = (input: object) => {
      const parsed = roofParamsSchema.safeParse({ ...base, ...input });
      return parsed.success ? [] : parsed.error.issues.map((i) => i.path.join("."));
    };
    expect(paths({ snowDriftEdge: "west" })).toEqual(["stepHeight", "upperRoofWidth"]);
    expect(paths({ windZones: true })).toEqual(["windPeakPressure", "roofHeight"]);
    expect(paths({ standard: "ASCE 7-22", snowDriftEdge: "west", stepHeight: 2, upperRoofWidth: 10, windZones: true, windPeakPressure: 1, roofHeight: 8 })).toEqual(["snowDriftEdge", "windZones"]);
    expect(paths({ snowDriftEdge: "up", stepHeight: -1 })).toEqual(["snowDriftEdge", "stepHeight"]);
  });

  it("refuses hostile values of the new fields with a message each, before anything is built", () => {
    // JSON cannot carry NaN or Infinity: they arrive as null; a number may arrive as a string, or be enormous
    const drift = { snowDriftEdge: "east", upperRoofWidth: 10 };
    const zones = { windZones: true, windPeakPressure: 1, roofHeight: 10 };
    for (const bad of [1e308, 99999999999, -3, Number.NaN, Infinity, null, "2", "x".repeat(100_000)]) {
      for (const [field, extra] of [["stepHeight", drift], ["upperRoofWidth", { ...drift, stepHeight: 2 }], ["windPeakPressure", zones], ["roofHeight", zones]] as const) {
        const parsed = roofParamsSchema.safeParse({ ...base, ...extra, [field]: bad });
        expect(parsed.success, `${field} = ${String(bad).slice(0, 20)}`).toBe(false);
        expect(parsed.error!.issues.some((i) => i.path.join(".") === field && i.message.length > 0)).toBe(true);
      }
    }
    for (const bad of ["__proto__", "constructor", "west\u0000", "\ud800", 1, null]) expect(roofParamsSchema.safeParse({ ...base, snowDriftEdge: bad }).success).toBe(false);
    for (const bad of ["true", 1, null]) expect(roofParamsSchema.safeParse({ ...base, ...zones, windZones: bad }).success).toBe(false);
  });
});
