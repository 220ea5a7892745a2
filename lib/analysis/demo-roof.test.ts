// The demo's story checked with the analysis and the clash detection themselves, so that a change of the engine,
// the review or the demo data cannot silently take the story away (README "What to try").
import { describe, expect, it } from "vitest";
import { detectClashes } from "../clash/detect";
import { DEMO_RUNS, STORY_RUNS } from "../mep/demo-runs";
import { runSchema } from "../mep/schemas";
import { reviewForStorage } from "../models/analyse";
import { analyzeModel } from "./analyze";
import { demoRoof } from "./demo-roof";
import { validateModel } from "./model";

const model = demoRoof();
const result = analyzeModel(model);
const review = reviewForStorage(model, result, "EN1993-1-1");
const GRAVITY = ["ULS-1", "ULS-2", "SLS-1"];
const WIND = "ULS-3";
const westEdgeChords = model.members.filter((m) => /^TCY-0-\d+$/.test(m.id)).map((m) => m.id);
const isZero = (id: string, combination: string) => result.results[combination].zeroForceMembers.includes(id);

describe("the demo roof tells the story", () => {
  it("is a valid, stable model", () => {
    expect(validateModel(model).ok).toBe(true);
    expect(result.status).toBe("ok");
  });

  it("the west edge chords are zero in every combination and idle", () => {
    // Statics (common practice): a member between two points that cannot move along it carries nothing.
    expect(westEdgeChords).toHaveLength(12);
    expect([...result.zeroInAll].sort()).toEqual([...westEdgeChords].sort());
    for (const id of westEdgeChords) expect(review!.members[id].verdict).toBe("idle");
  });

  it("the restraint struts are zero under every gravity combination and work under the wind from the west", () => {
    for (const id of ["RS-W1", "RS-W2"]) {
      for (const combination of GRAVITY) expect(isZero(id, combination), `${id} in ${combination}`).toBe(true);
      expect(isZero(id, WIND)).toBe(false);
      expect(review!.members[id].verdict).toBe("load-bearing");
      // Plan equilibrium (statics): the two struts, symmetric about mid-length, share the eaves' x load equally:
      // 1.5 (EN 1990 Table A1.2(B)) x (0.7 + 0.3) x 0.75 kN/m2 x 4.5 m x 36 m / 2 = 91.125 kN.
      expect(Math.abs(result.results[WIND].memberForces[id])).toBeCloseTo((1.5 * (0.7 + 0.3) * 0.75 * 4.5 * 36) / 2, 6);
    }
  });

  it("apart from those, every member works in every combination", () => {
    for (const combination of [...GRAVITY, WIND]) {
      const expected = combination === WIND ? westEdgeChords : [...westEdgeChords, "RS-W1", "RS-W2"];
      expect([...result.results[combination].zeroForceMembers].sort()).toEqual(expected.sort());
    }
  });

  it("each story run cuts exactly the member its story needs", () => {
    const runs = DEMO_RUNS.map((run) => runSchema.parse(run));
    const found = detectClashes(model, runs);
    const cut = (runId: string) => found.filter((c) => c.runId === runId).map((c) => c.memberId);
    expect(cut(STORY_RUNS.zeroEverywhere)).toEqual(["TCY-0-5"]);
    expect(cut(STORY_RUNS.zeroUnderGravity)).toEqual(["RS-W1"]);
    expect(cut(STORY_RUNS.workingChord)).toEqual(["BCX-7-5"]);
    // The working chord carries hundreds of kN in every gravity combination.
    for (const combination of GRAVITY) expect(Math.abs(result.results[combination].memberForces["BCX-7-5"])).toBeGreaterThan(200);
  });
});
