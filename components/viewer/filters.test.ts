import { describe, expect, it } from "vitest";
import { STATE_CODE } from "./colouring";
import { autoDeflectionScale, buildMemberEnds, buildNodeTable, defaultFilters, deflectedPositions, modePositions, nodesInBox, roundedModelBox, visibleMask } from "./filters";
import type { MemberGroup } from "./types";

// A one-bay pyramid: four bottom nodes on a 2 m square, one top node 1 m above the centre (hand-made geometry).
const model = {
  nodes: [
    { id: "N1", x: 0, y: 0, z: 0 },
    { id: "N2", x: 2, y: 0, z: 0 },
    { id: "N3", x: 2, y: 2, z: 0 },
    { id: "N4", x: 0, y: 2, z: 0 },
    { id: "T", x: 1, y: 1, z: 1 },
  ],
  members: [
    { id: "B1", i: "N1", j: "N2", section: "s" },
    { id: "B2", i: "N2", j: "N3", section: "s" },
    { id: "D1", i: "N1", j: "T", section: "s" },
    { id: "D2", i: "N3", j: "T", section: "s" },
  ],
};
const groups: Record<string, MemberGroup> = { B1: "bottom_chord", B2: "bottom_chord", D1: "diagonal", D2: "other" };
const memberIds = model.members.map((m) => m.id);
const nodes = buildNodeTable(model);
const ends = buildMemberEnds(model, nodes);
// B1 5 kN, B2 zero-force, D1 and D2 -3 kN.
const states = Uint8Array.from([STATE_CODE.tension, STATE_CODE["zero-force"], STATE_CODE.compression, STATE_CODE.compression]);

describe("member filters", () => {
  it("shows everything by default", () => {
    expect(Array.from(visibleMask({ memberIds, ends, positions: nodes.positions, groups, states, filters: defaultFilters }))).toEqual([1, 1, 1, 1]);
  });

  it("filters by member group", () => {
    const filters = { ...defaultFilters, groups: { top_chord: true, bottom_chord: false, diagonal: false } };
    // D2 is classed "other" (neither chord layer nor a web member between them): never filtered by group.
    expect(Array.from(visibleMask({ memberIds, ends, positions: nodes.positions, groups, states, filters }))).toEqual([0, 0, 0, 1]);
  });

  it("hides zero-force members", () => {
    const filters = { ...defaultFilters, hideZeroForce: true };
    expect(Array.from(visibleMask({ memberIds, ends, positions: nodes.positions, groups, states, filters }))).toEqual([1, 0, 1, 1]);
  });

  it("cuts with a section box by member midpoint", () => {
    // Midpoints: B1 (1,0,0), B2 (2,1,0), D1 (0.5,0.5,0.5), D2 (1.5,1.5,0.5).
    const filters = { ...defaultFilters, sectionBox: { min: [0, 0, 0] as [number, number, number], max: [1, 1, 1] as [number, number, number] } };
    expect(Array.from(visibleMask({ memberIds, ends, positions: nodes.positions, groups, states, filters }))).toEqual([1, 0, 1, 0]);
  });
});

describe("deflected shape", () => {
  const byNode: Record<string, [number, number, number]> = { T: [0, 0, -0.01], N1: [0, 0, 0] };
  // In node order, as the result columns carry them.
  const displacements = Float32Array.from(nodes.ids.flatMap((id) => byNode[id] ?? [0, 0, 0]));

  it("moves nodes by displacement times scale", () => {
    const moved = deflectedPositions(nodes, displacements, 50);
    expect(moved[4 * 3 + 2]).toBeCloseTo(1 - 0.5, 6);
    expect(moved[0]).toBe(0);
    expect(deflectedPositions(nodes, displacements, 0)).toEqual(nodes.positions);
  });

  it("chooses a scale that makes the largest displacement a tenth of the span", () => {
    // span 2 m, largest displacement 0.01 m → 0.2 / 0.01 = 20.
    expect(autoDeflectionScale(nodes, displacements)).toBe(20);
  });
});

describe("a drawn mode", () => {
  it("moves each node along its share of the mode, the largest motion a tenth of the span (2 m here)", () => {
    // the mode moves T up by its full size and N2 sideways by half; the other nodes stay put
    const shape = [0, 0, 0, 0.5, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 1];
    const moved = modePositions(nodes, model.nodes.map((n) => n.id), shape);
    const t = nodes.index.get("T")! * 3;
    const n2 = nodes.index.get("N2")! * 3;
    expect(moved[t + 2] - nodes.positions[t + 2]).toBeCloseTo(0.2, 6);
    expect(moved[n2] - nodes.positions[n2]).toBeCloseTo(0.1, 6);
    expect(moved[0]).toBe(nodes.positions[0]);
  });
});

describe("section box", () => {
  it("hides the nodes outside the box too (their supports, load arrows and labels go with them)", () => {
    expect(nodesInBox(nodes.positions, null)).toBeNull();
    const box = { min: [0, 0, 0] as [number, number, number], max: [2, 2, 0.5] as [number, number, number] };
    expect(Array.from(nodesInBox(nodes.positions, box)!)).toEqual([1, 1, 1, 1, 0]);
  });

  it("offers the model's box rounded to the centimetre, still holding every node", () => {
    // 1.8 and -0.3 are not exact in binary: as 32-bit floats they read back as 1.7999999523… and -0.30000001192…
    const positions = Float32Array.from([-0.3, 0, 0, 12.5, 1.8, 2.345]);
    expect(positions[4]).not.toBe(1.8);
    const box = roundedModelBox(positions);
    expect(box).toEqual({ min: [-0.3, 0, 0], max: [12.5, 1.8, 2.35] });
    expect(Array.from(nodesInBox(positions, box)!)).toEqual([1, 1]);
  });
});
