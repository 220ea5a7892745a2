import { describe, expect, it } from "vitest";
import { pointLoads, triangleModel } from "@/tests/support/fixtures/analysis-models";
import { handleAnalysisRequest } from "./worker-protocol";

describe("Web Worker protocol", () => {
  const model = triangleModel({
    loadCases: [pointLoads("G", [["C", 0, 0, -10]])],
  });

  it("answers a valid model with the analysis result under the same id, and survives structured cloning", () => {
    const response = structuredClone(handleAnalysisRequest({ id: 7, model: structuredClone(model), lowForceThreshold: 7 }));
    expect(response.id).toBe(7);
    expect(response.ok && response.result.results.G.memberForces.AB).toBeCloseTo(20 / 3, 9); // method of joints PL/(4h)
    expect(response.ok && response.result.info.lowForce?.members.G).toEqual(["AB"]);
  });

  it("answers an invalid model with its problems", () => {
    const response = handleAnalysisRequest({ id: 8, model: { ...model, members: [{ id: "X", i: "A", j: "Q", section: "T" }] } });
    expect(response).toMatchObject({ id: 8, ok: false, problems: [{ where: 'members[0] "X"', message: expect.stringMatching(/missing node "Q"/) }] });
  });
});
