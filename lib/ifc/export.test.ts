import * as WebIFC from "web-ifc";
import { describe, expect, it } from "vitest";
import { analyzeModel } from "@/lib/analysis";
import { pointLoads, triangleModel } from "@/tests/support/fixtures/analysis-models";
import { forceStateIn as forceState } from "@/lib/vocabulary/force-state";
import { exportIfc, memberGlobalId, readIfcRoof } from "./index";

const model = triangleModel({ loadCases: [pointLoads("1a", [["C", 0, 0, -10]])] });
const analysis = analyzeModel(model);
const result = { id: "1a", name: "Case 1a", memberForces: analysis.results["1a"].memberForces, zeroForceMembers: analysis.results["1a"].zeroForceMembers };
const text = exportIfc({
  model,
  projectName: "Test roof",
  fileName: "test-roof.ifc",
  time: "2026-01-01T00:00:00",
  result,
  openings: [{ clashKey: "k1", memberId: "AB", runId: "SA-01", point: [2, 0, 0], direction: [0, 1, 0], diameter: 0.05, conditions: "Sleeve and ring plate, see sketch 3." }],
});

// Reads the exported file with web-ifc itself (the reference reader), not with our own parser.
async function openWithWebIfc() {
  const api = new WebIFC.IfcAPI();
  await api.Init();
  const id = api.OpenModel(new TextEncoder().encode(text));
  const lines = (type: number) => {
    const v = api.GetLineIDsWithType(id, type);
    return Array.from({ length: v.size() }, (_, k) => api.GetLine(id, v.get(k), true));
  };
  return { api, id, lines };
}

describe("IFC4 export of a revision", () => {
  it("web-ifc reads back one IfcMember per member with its GlobalId, circular hollow profile and force state", async () => {
    const { api, id, lines } = await openWithWebIfc();
    expect(api.GetModelSchema(id)).toBe("IFC4");
    const members = lines(WebIFC.IFCMEMBER);
    expect(members.map((m) => m.Name.value).sort()).toEqual(["AB", "AC", "BC"]);
    for (const m of members) {
      expect(m.GlobalId.value).toBe(memberGlobalId(m.Name.value));
      const solid = m.Representation.Representations[0].Items[0];
      expect(solid.SweptArea.Radius.value).toBeCloseTo(0.0889 / 2, 9);
      expect(solid.SweptArea.WallThickness.value).toBeCloseTo(0.004, 9);
    }
    const rels = lines(WebIFC.IFCRELDEFINESBYPROPERTIES).filter((r) => r.RelatingPropertyDefinition.Name.value === "Strutroom_ForceState");
    expect(rels).toHaveLength(3);
    for (const rel of rels) {
      const memberId = rel.RelatedObjects[0].Name.value as string;
      const props = Object.fromEntries(rel.RelatingPropertyDefinition.HasProperties.map((p: { Name: { value: string }; NominalValue: { value: unknown } }) => [p.Name.value, p.NominalValue.value]));
      expect(props.ResultId).toBe("1a");
      expect(props.AxialForce).toBeCloseTo(result.memberForces[memberId], 9);
      expect(props.ForceState).toBe(forceState(result, memberId));
    }
    // Method of joints (check-values.md Example 1a): AB in tension, AC and BC in compression.
    expect(["AB", "AC", "BC"].map((m) => forceState(result, m))).toEqual(["tension", "compression", "compression"]);
    const openings = lines(WebIFC.IFCOPENINGELEMENT);
    expect(openings).toHaveLength(1);
    const voids = lines(WebIFC.IFCRELVOIDSELEMENT);
    expect(voids[0].RelatingBuildingElement.Name.value).toBe("AB");
    api.CloseModel(id);
  });

  it("our IFC roof import reads the export back into the same members, nodes and section", async () => {
    const back = await readIfcRoof(new TextEncoder().encode(text));
    if ("message" in back) throw new Error(back.message);
    expect(back.problems).toEqual([]);
    expect(back.source).toBe("physical members");
    const coordinates = (m: typeof model, id: string) => {
      const n = m.nodes.find((node) => node.id === id)!;
      return [n.x, n.y, n.z];
    };
    for (const member of model.members) {
      const read = back.model!.members.find((m) => m.id === member.id)!;
      expect(coordinates(back.model!, read.i)).toEqual(coordinates(model, member.i));
      expect(coordinates(back.model!, read.j)).toEqual(coordinates(model, member.j));
    }
    expect(back.model!.nodes).toHaveLength(3);
    expect(back.model!.sections[0]).toMatchObject({ outerDiameter: 0.0889, wallThickness: 0.004 });
    expect(back.model!.materials[0]).toMatchObject({ id: "S", E: 2e8, fy: 355e3, unitWeight: expect.closeTo(78.5, 6) });
  });

  it("writes text outside ASCII and quotes as STEP escapes that web-ifc decodes", async () => {
    const named = exportIfc({ model: { ...model, name: "Hall \u00e9t\u00e9 'north'" }, projectName: "P", fileName: "x.ifc", time: "2026-01-01T00:00:00", openings: [] });
    expect(named).toContain("'Hall \\X2\\00E9\\X0\\t\\X2\\00E9\\X0\\ ''north'''");
    const api = new WebIFC.IfcAPI();
    await api.Init();
    const id = api.OpenModel(new TextEncoder().encode(named));
    const building = api.GetLine(id, api.GetLineIDsWithType(id, WebIFC.IFCBUILDING).get(0));
    expect(building.Name.value).toBe("Hall \u00e9t\u00e9 'north'");
    api.CloseModel(id);
  });
});
