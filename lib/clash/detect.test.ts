import { describe, expect, it } from "vitest";
import { runSchema, type Run, type RunInput } from "@/lib/mep/schemas";
import { detectClashes, type ClashModel } from "./detect";
import { clashKey } from "./ids";

// Geometry is hand-computed in the comments (elementary vector geometry).

const tube = { id: "T", outerDiameter: 0.1 }; // member radius 0.05 m

function run(input: Partial<RunInput> & Pick<RunInput, "points" | "profile">): Run {
  return runSchema.parse({ id: "R1", system: "supply air", weightPerMetre: 0.3, insulation: 0, clearance: 0, ...input });
}

/** One member along x from (0,0,0) to (4,0,0). */
const oneMember: ClashModel = {
  nodes: [
    { id: "A", x: 0, y: 0, z: 0 },
    { id: "B", x: 4, y: 0, z: 0 },
  ],
  members: [{ id: "M1", i: "A", j: "B", section: "T" }],
  sections: [tube],
};

describe("round runs against one member", () => {
  // Duct along y at x = 2 and height z; axis distance to the member = z. Diameter 0.4 + insulation 0.05 → swept
  // radius 0.25. At z = 0.5: gap = 0.5 − 0.05 − 0.25 = 0.20 m.
  const duct = (z: number, clearance: number) =>
    run({ profile: { shape: "round", diameter: 0.4 }, insulation: 0.05, clearance, points: [{ x: 2, y: -2, z }, { x: 2, y: 2, z }] });

  it("reports a clearance clash when the gap is just under the required clearance", () => {
    const [clash, ...rest] = detectClashes(oneMember, [duct(0.5, 0.21)]);
    expect(rest).toHaveLength(0);
    expect(clash.kind).toBe("clearance");
    expect(clash.gap).toBeCloseTo(0.2, 12);
    expect(clash.depth).toBeCloseTo(0.01, 12); // shortfall 0.21 − 0.20
    // Member surface at z 0.05, duct surface at z 0.25: midway z = 0.15, above (2,0).
    expect(clash.point.x).toBeCloseTo(2, 12);
    expect(clash.point.y).toBeCloseTo(0, 12);
    expect(clash.point.z).toBeCloseTo(0.15, 12);
  });

  it("reports nothing when the gap is just over the required clearance", () => {
    expect(detectClashes(oneMember, [duct(0.5, 0.19)])).toEqual([]);
  });

  it("reports a hard clash with its overlap depth", () => {
    // z = 0.25: gap = 0.25 − 0.30 = −0.05 → bodies overlap by 0.05.
    const [clash] = detectClashes(oneMember, [duct(0.25, 0)]);
    expect(clash.kind).toBe("hard");
    expect(clash.depth).toBeCloseTo(0.05, 12);
  });

  it("treats touching surfaces as a clearance question, not an overlap", () => {
    // z = 0.30: gap = 0.30 − 0.30 = 0. Without required clearance: no clash; with 0.05: clearance clash 0.05.
    expect(detectClashes(oneMember, [duct(0.3, 0)])).toEqual([]);
    const [clash] = detectClashes(oneMember, [duct(0.3, 0.05)]);
    expect(clash.kind).toBe("clearance");
    expect(clash.depth).toBeCloseTo(0.05, 12);
  });

  it("measures a run whose end touches the member's end", () => {
    // Riser starting 0.25 above the member's end B (4,0,0): end-to-end distance 0.25; radii 0.05 + 0.2 = 0.25 → gap 0.
    const riser = run({ profile: { shape: "round", diameter: 0.4 }, clearance: 0.1, points: [{ x: 4, y: 0, z: 0.25 }, { x: 4, y: 0, z: 3 }] });
    const [clash] = detectClashes(oneMember, [riser]);
    expect(clash.gap).toBeCloseTo(0, 12);
    expect(clash.depth).toBeCloseTo(0.1, 12);
  });
});

describe("rectangular runs against a member", () => {
  // Duct along x, 0.6 wide × 0.2 high, centred on the x-axis; member along y at x = 0, z = 0.25 (radius 0.05).
  const crossing: ClashModel = {
    nodes: [
      { id: "A", x: 0, y: -2, z: 0.25 },
      { id: "B", x: 0, y: 2, z: 0.25 },
    ],
    members: [{ id: "M1", i: "A", j: "B", section: "T" }],
    sections: [tube],
  };
  const duct = (rotation: number, clearance = 0) =>
    run({ profile: { shape: "rectangular", width: 0.6, height: 0.2, rotation }, clearance, points: [{ x: -2, y: 0, z: 0 }, { x: 2, y: 0, z: 0 }] });

  it("unrotated: height vertical, top face at 0.1, gap 0.25 − 0.1 − 0.05 = 0.10", () => {
    expect(detectClashes(crossing, [duct(0)])).toEqual([]);
    const [clash] = detectClashes(crossing, [duct(0, 0.12)]);
    expect(clash.gap).toBeCloseTo(0.1, 9);
    expect(clash.kind).toBe("clearance");
  });

  it("rotated 90°: width vertical, top at 0.3, member axis 0.05 inside → depth 0.05 + 0.05 = 0.10", () => {
    const [clash] = detectClashes(crossing, [duct(90)]);
    expect(clash.kind).toBe("hard");
    expect(clash.depth).toBeCloseTo(0.1, 9);
  });

  it("rotated 45°: the deepest point of the member axis is 0.25/√2 − 0.2 inside", () => {
    // Section axes w = (ŷ + ẑ)/√2, h = (ẑ − ŷ)/√2. On the member line (x = 0, z = 0.25) at y, local coordinates are
    // a = (y + 0.25)/√2 and b = (0.25 − y)/√2; inside, the signed distance is max(|a| − 0.3, |b| − 0.1), smallest
    // where both are equal: √2·y = 0.2 → y = 0.1√2, value 0.1 + 0.25/√2 − 0.3 = 0.25/√2 − 0.2 = −0.0232233.
    // Gap = −0.0232233 − 0.05 = −0.0732233.
    const [clash] = detectClashes(crossing, [duct(45)]);
    expect(clash.kind).toBe("hard");
    expect(clash.gap).toBeCloseTo(0.25 / Math.SQRT2 - 0.2 - 0.05, 9);
    expect(clash.point.y).toBeCloseTo(0.1 * Math.SQRT2, 6);
  });

  it("a member parallel to the duct above it: gap 0.4 − 0.1 − 0.05 = 0.25", () => {
    const parallel: ClashModel = {
      nodes: [
        { id: "A", x: -1, y: 0, z: 0.4 },
        { id: "B", x: 1, y: 0, z: 0.4 },
      ],
      members: [{ id: "M1", i: "A", j: "B", section: "T" }],
      sections: [tube],
    };
    expect(detectClashes(parallel, [duct(0, 0.24)])).toEqual([]);
    expect(detectClashes(parallel, [duct(0, 0.26)])[0].gap).toBeCloseTo(0.25, 9);
  });
});

/**
 * Square-on-square offset double-layer grid: n × n modules of size a, depth h. Top nodes (a·i, a·j, h) for
 * i, j = 0..n; bottom nodes (a·i + a/2, a·j + a/2, 0) for i, j = 0..n−1; each bottom node has 4 diagonals.
 */
function grid(n: number, a: number, h: number): ClashModel {
  const nodes: ClashModel["nodes"] = [];
  const members: ClashModel["members"] = [];
  for (let i = 0; i <= n; i++) for (let j = 0; j <= n; j++) nodes.push({ id: `T${i}.${j}`, x: a * i, y: a * j, z: h });
  for (let i = 0; i < n; i++) for (let j = 0; j < n; j++) nodes.push({ id: `B${i}.${j}`, x: a * i + a / 2, y: a * j + a / 2, z: 0 });
  const add = (id: string, i: string, j: string) => members.push({ id, i, j, section: "T" });
  for (let i = 0; i <= n; i++)
    for (let j = 0; j <= n; j++) {
      if (i < n) add(`TX${i}.${j}`, `T${i}.${j}`, `T${i + 1}.${j}`);
      if (j < n) add(`TY${i}.${j}`, `T${i}.${j}`, `T${i}.${j + 1}`);
    }
  for (let i = 0; i < n; i++)
    for (let j = 0; j < n; j++) {
      if (i < n - 1) add(`BX${i}.${j}`, `B${i}.${j}`, `B${i + 1}.${j}`);
      if (j < n - 1) add(`BY${i}.${j}`, `B${i}.${j}`, `B${i}.${j + 1}`);
      for (const [di, dj] of [[0, 0], [1, 0], [0, 1], [1, 1]]) add(`D${i}.${j}.${di}${dj}`, `T${i + di}.${j + dj}`, `B${i}.${j}`);
    }
  return { nodes, members, sections: [tube] };
}

describe("a generated grid with runs at known heights", () => {
  // 3 × 3 modules of 3 m, 2 m deep. A duct ⌀0.5 + insulation 0.05 (swept radius 0.3) along x at y = 1.5,
  // two segments split at x = 4.5.
  const model = grid(3, 3, 2);
  const along = (z: number, clearance: number) =>
    run({
      profile: { shape: "round", diameter: 0.5 },
      insulation: 0.05,
      clearance,
      points: [{ x: -1, y: 1.5, z }, { x: 4.5, y: 1.5, z }, { x: 10, y: 1.5, z }],
    });

  it("at mid-depth, only the diagonals of the first bottom row fall inside the clearance", () => {
    // Diagonal from top (0,0,2) to bottom (1.5,1.5,0): (1.5t, 1.5t, 2 − 2t). Squared distance to the line
    // y = 1.5, z = 1 is (1.5t − 1.5)² + (1 − 2t)², least at 12.5t = 8.5 → t = 0.68: 0.2304 + 0.1296 = 0.36,
    // distance 0.6 → gap 0.6 − 0.05 − 0.3 = 0.25. By symmetry all 4 diagonals of each of the 3 bottom nodes in
    // row j = 0 are 0.6 away (closest at x = 1.02, 1.98, 4.02 | 4.98, 7.02, 7.98 — split by segment at 4.5).
    // Everything else is at least 1.0 away (chords straight above/below, gap 0.65) or 1.8 (next row's diagonals).
    const clashes = detectClashes(model, [along(1, 0.3)]);
    expect(clashes).toHaveLength(12);
    for (const c of clashes) {
      expect(c.kind).toBe("clearance");
      expect(c.gap).toBeCloseTo(0.25, 9);
      expect(c.depth).toBeCloseTo(0.05, 9);
    }
    const bySegment = (k: number) => clashes.filter((c) => c.segmentIndex === k).map((c) => c.memberId).sort();
    expect(bySegment(0)).toEqual(["D0.0.00", "D0.0.01", "D0.0.10", "D0.0.11", "D1.0.00", "D1.0.01"]);
    expect(bySegment(1)).toEqual(["D1.0.10", "D1.0.11", "D2.0.00", "D2.0.01", "D2.0.10", "D2.0.11"]);
    // Clearance 0.2 < gap 0.25: no clashes at all.
    expect(detectClashes(model, [along(1, 0.2)])).toEqual([]);
  });

  it("at top-chord height, it cuts the four y-direction top chords of the first row", () => {
    // Axis at z = 2 crosses TY i.0 (x = 3i, y 0..3) at distance 0: overlap 0.05 + 0.3 = 0.35. Diagonals are
    // 1.2 away ((1.5t − 1.5)² + (2t)² least at t = 0.36: 0.9216 + 0.5184 = 1.44), x-chords 1.5 away.
    const clashes = detectClashes(model, [along(2, 0.3)]);
    expect(clashes.map((c) => c.memberId).sort()).toEqual(["TY0.0", "TY1.0", "TY2.0", "TY3.0"]);
    for (const c of clashes) {
      expect(c.kind).toBe("hard");
      expect(c.depth).toBeCloseTo(0.35, 9);
    }
  });

  it("above the roof there is nothing", () => {
    // Top chords at z = 2; axis at 3.5: gap 1.5 − 0.35 = 1.15 > 0.3.
    expect(detectClashes(model, [along(3.5, 0.3)])).toEqual([]);
  });

  it("keeps clash ids when the run moves but the same pairs still clash", () => {
    const before = detectClashes(model, [along(2, 0.3)]).map((c) => c.id);
    const after = detectClashes(model, [along(2.05, 0.3)]).map((c) => c.id);
    expect(after).toEqual(before);
    expect(before[0]).toBe(clashKey("TY0.0", "R1", 0));
    expect(new Set(before).size).toBe(before.length);
  });
});
