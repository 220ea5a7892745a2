import { describe, expect, it } from "vitest";
import { ultimateStrength } from "./grades";
import { DEFAULT_FABRICATION, validateModel, type TrussModel } from "./model";
import { pointLoads, triangleModel } from "@/tests/support/fixtures/analysis-models";

const valid = (): TrussModel =>
  triangleModel({
    supports: [
      ["A", true, true, true],
      ["B", false, true, true],
    ],
    loadCases: [pointLoads("G", [["C", 0, 0, -10]])],
    combinations: [{ id: "U1", name: "1.35G", factors: { G: 1.35 } }],
  });

/** Problems of a model changed by `edit`, as "where: message" lines. */
function problemsOf(edit: (m: TrussModel) => void): string[] {
  const model = valid();
  edit(model);
  const result = validateModel(model);
  expect(result.ok).toBe(false);
  return result.ok ? [] : result.problems.map((p) => `${p.where}: ${p.message}`);
}

describe("validateModel", () => {
  it("accepts a valid model and keeps the optional effective length factor", () => {
    const model = valid();
    model.members[0].effectiveLengthFactor = 0.9;
    const result = validateModel(model);
    expect(result.ok).toBe(true);
    expect(result.ok && result.model.members[0].effectiveLengthFactor).toBe(0.9);
  });

  it("keeps truss-model/1 files without fu or fabrication valid; the stated defaults apply (grade table, cold-formed)", () => {
    const model = valid();
    const result = validateModel(model);
    expect(result.ok && result.model.materials[0].fu).toBeUndefined();
    expect(result.ok && result.model.sections[0].fabrication).toBeUndefined();
    expect(DEFAULT_FABRICATION).toBe("cold-formed");
    // S355: fu 510 MPa, EN 1993-1-1 Table 3.1 (from memory); an unknown grade falls to 1.10·fy (3.2.2(1), from memory)
    expect(ultimateStrength({ id: "S355", fy: 355e3 }).fu).toBe(510e3);
    expect(ultimateStrength({ id: "A500 Gr C", fy: 46 * 6894.757 }).fu).toBeCloseTo(62 * 6894.757, 6);
    expect(ultimateStrength({ id: "own", fy: 300e3 }).fu).toBeCloseTo(330e3, 6);
    expect(ultimateStrength({ id: "own", fy: 300e3, fu: 420e3 })).toEqual({ fu: 420e3, source: "model material" });
  });

  it.each<[string, (m: TrussModel) => void, RegExp]>([
    ["zero-length member", (m) => (m.nodes[2] = { id: "C", x: 4, y: 0, z: 0 }), /members\[2\] "BC": member "BC" has zero length/],
    ["member joining a node to itself", (m) => (m.members[0].j = "A"), /members\[0\] "AB": .*joins node "A" to itself/],
    ["duplicate node id", (m) => m.nodes.push({ id: "B", x: 9, y: 9, z: 9 }), /nodes\[3\] "B": duplicate node id "B" \(first at nodes\[1\] "B"\)/],
    ["duplicate member id", (m) => m.members.push({ id: "AB", i: "A", j: "C", section: "T" }), /members\[3\] "AB": duplicate member id/],
    ["missing id", (m) => (m.nodes[0].id = ""), /nodes\[0\] id: id must not be empty/],
    ["member to a missing node", (m) => (m.members[1].j = "Z"), /members\[1\] "AC": member "AC" ends at a missing node "Z"/],
    ["fu below fy", (m) => (m.materials[0].fu = 300e3), /materials\[0\] "S": ultimate strength fu must not be below fy/],
    ["unknown fabrication", (m) => ((m.sections[0] as { fabrication?: string }).fabrication = "welded"), /sections\[0\] "T" fabrication/],
    ["duplicate member between the same nodes", (m) => m.members.push({ id: "BA", i: "B", j: "A", section: "T" }), /members\[3\] "BA": member "BA" duplicates member "AB"/],
    ["load on a missing node", (m) => m.loadCases[0].nodalLoads.push({ node: "Q", fx: 0, fy: 0, fz: 1 }), /loadCases\[0\] "G" nodalLoads\[1\]: .*missing node "Q"/],
    ["non-finite number", (m) => (m.nodes[1].x = Number.POSITIVE_INFINITY), /nodes\[1\] "B" x: .*finite/],
    ["NaN", (m) => (m.loadCases[0].nodalLoads[0].fz = Number.NaN), /loadCases\[0\] "G" nodalLoads\[0\] fz: .*finite/],
    ["combination naming a missing case", (m) => (m.combinations[0].factors.S = 1.5), /combinations\[0\] "U1": combination "U1" names a missing load case "S"/],
    ["negative area", (m) => (m.sections[0].area = -0.001), /sections\[0\] "T": area must be positive/],
    ["negative modulus", (m) => (m.materials[0].E = -2e8), /materials\[0\] "S": modulus E must be positive/],
    ["section naming a missing material", (m) => (m.sections[0].material = "S275"), /sections\[0\] "T": section "T" names a missing material "S275"/],
    ["member naming a missing section", (m) => (m.members[2].section = "CHS 60"), /members\[2\] "BC": member "BC" names a missing section "CHS 60"/],
    ["support on a missing node", (m) => m.supports.push({ node: "Q", ux: true, uy: true, uz: true }), /supports\[2\] "Q": support on a missing node/],
    ["unknown load category", (m) => ((m.loadCases[0] as { category: string }).category = "seismic"), /loadCases\[0\] "G" category/],
  ])("reports %s with where it is", (_name, edit, expected) => {
    expect(problemsOf(edit).join("\n")).toMatch(expected);
  });

  it("lists every problem at once, not just the first", () => {
    const lines = problemsOf((m) => {
      m.members[0].i = "X";
      m.members[1].section = "none";
      m.sections[0].area = 0;
      m.combinations[0].factors.W = 1;
    });
    expect(lines, lines.join("\n")).toHaveLength(4);
  });

  it("rejects input that is not a model at all", () => {
    const result = validateModel({ format: "something-else" });
    expect(result.ok).toBe(false);
    expect(!result.ok && result.problems.map((p) => p.where)).toContain("format");
  });
});

describe("validateModel after a wrong type", () => {
  it("still checks the cross-references of the other rows", () => {
    const model = valid() as unknown as { nodes: { x: unknown }[]; members: { j: string }[] };
    model.nodes[0].x = "zero";
    model.members[2].j = "Q";
    const result = validateModel(model);
    const lines = result.ok ? [] : result.problems.map((p) => `${p.where}: ${p.message}`);
    expect(lines).toHaveLength(2);
    expect(lines[0]).toMatch(/^nodes\[0\] "A" x: .*number/);
    expect(lines[1]).toMatch(/^members\[2\] "BC": member "BC" ends at a missing node "Q"/);
  });

  it("reports a row's broken links beside its type error (issue 17 item 13)", () => {
    const model = valid() as unknown as { sections: { area: unknown; material: string }[]; members: { j: string; section: string; effectiveLengthFactor?: unknown }[] };
    model.sections[0].area = "abc";
    model.sections[0].material = "S999";
    model.members[1].effectiveLengthFactor = "one";
    model.members[1].j = "Q";
    model.members[1].section = "none";
    const result = validateModel(model);
    const lines = result.ok ? [] : result.problems.map((p) => `${p.where}: ${p.message}`);
    expect(lines, lines.join("\n")).toHaveLength(5);
    expect(lines.some((l) => /^sections\[0\] .*area: .*number/.test(l))).toBe(true);
    expect(lines.some((l) => /names a missing material "S999"/.test(l))).toBe(true);
    expect(lines.some((l) => /effectiveLengthFactor: .*number/.test(l))).toBe(true);
    expect(lines.some((l) => /ends at a missing node "Q"/.test(l))).toBe(true);
    expect(lines.some((l) => /names a missing section "none"/.test(l))).toBe(true);
  });

  it("does not report stand-in values as further problems of a broken row", () => {
    const model = valid() as unknown as { sections: { area: unknown }[] };
    model.sections[0].area = "big";
    const result = validateModel(model);
    expect(result.ok).toBe(false);
    expect(!result.ok && result.problems).toHaveLength(1);
  });
});

describe("bounds (lib/limits.ts) and hostile values", () => {
  it("refuses coordinates of 1e308 and E = 1e308 instead of analysing them", () => {
    const lines = problemsOf((m) => {
      m.nodes[0].x = 1e308;
      m.materials[0].E = 1e308;
    });
    expect(lines.some((l) => /coordinates must be within/.test(l))).toBe(true);
    expect(lines.some((l) => /modulus E must be from/.test(l))).toBe(true);
    expect(lines.some((l) => /members are at most/.test(l))).toBe(true);
  });

  it("refuses an empty model", () => {
    const lines = problemsOf((m) => {
      m.nodes = [];
      m.members = [];
      m.supports = [];
      m.loadCases = [];
      m.combinations = [];
    });
    expect(lines).toContain("model: the model needs at least one node and one member");
  });

  it("refuses two nodes at the same point, also when they are not joined", () => {
    const lines = problemsOf((m) => m.nodes.push({ ...m.nodes[2], id: "C2", x: m.nodes[2].x + 1e-6 }));
    expect(lines.some((l) => /node "C2" is at the same point as node "C"/.test(l))).toBe(true);
  });

  it("refuses constructor as an id and never loses a __proto__ factor silently", () => {
    expect(problemsOf((m) => (m.loadCases[0].id = "constructor"))).toContain('loadCases[0] "constructor" id: "constructor" is a reserved name: choose another.');
    const lines = problemsOf((m) => (m.combinations[0].factors = JSON.parse('{"G": 1.35, "__proto__": 1.5}')));
    expect(lines).toContain('combinations[0] "U1" factors __proto__: "__proto__" is a reserved name: choose another.');
  });

  it("refuses a null character in an id and an unpaired surrogate in a name (PostgreSQL cannot store them)", () => {
    const lines = problemsOf((m) => {
      m.nodes[0].id = "A\u0000";
      m.name = "roof \ud800";
    });
    expect(lines.filter((l) => /null characters/.test(l)).length).toBeGreaterThanOrEqual(2);
  });

  it("counts tables before checking rows: 100,000 load cases are refused at once", () => {
    const model = valid();
    const many = Array.from({ length: 100_000 }, (_, k) => ({ ...model.loadCases[0], id: `G${k}` }));
    const result = validateModel({ ...model, loadCases: many });
    expect(result.ok).toBe(false);
    expect(!result.ok && result.problems).toEqual([{ where: "loadCases", message: "100,000 loadCases: a model may have at most 200" }]);
  });
});
