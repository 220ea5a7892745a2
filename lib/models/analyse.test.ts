import { describe, expect, it } from "vitest";
import { generateRoof } from "@/lib/analysis/generator";
import { wholeRoofCheckMembers } from "@/lib/limits";
import { analyseForStorage } from "./analyse";

describe("analyseForStorage on a roof past the whole-roof check limit", () => {
  it("still reviews every member, leaves out overall stability and any-load, and says why", () => {
    // 36 x 36 bays, square on square offset: 8 x 36 x 36 = 10,368 members (roofSize), just past the limit.
    const model = generateRoof({ spanX: 108, spanY: 108, module: 3, depth: 3 });
    expect(model.members.length).toBeGreaterThan(wholeRoofCheckMembers);
    const { result, review } = analyseForStorage(model, "EN1993-1-1");
    expect(result.status).toBe("ok");
    expect(Object.keys(review!.members)).toHaveLength(model.members.length);
    expect(review!.stability).toBeUndefined();
    expect(review!.anyLoad).toBeUndefined();
    expect(Object.values(review!.members).every((m) => m.anyLoad === undefined && typeof m.verdict === "string")).toBe(true);
    // "idle" rests on the load patterns analysed: kept on the review itself, so they show beside every idle verdict
    expect(review!.analysedPatterns).toEqual(model.loadCases.map((c) => ({ id: c.id, name: c.name })));
    expect(review!.analysedPatterns!.map((p) => p.id)).toEqual(["dead", "services", "snow", "wind-uplift"]);
    expect(review!.wholeRoofChecksLeftOut).toBe(`Overall stability and "idle for any roof load" are checked with the analysis for roofs of up to 10,000 members; this one has ${model.members.length.toLocaleString("en")}. "Idle for any roof load" can be run for the whole roof as a job from the viewer.`);
  }, 120_000);
});
