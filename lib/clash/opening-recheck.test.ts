// The opening check of an accepted opening as a carried decision is re-checked (issue 16 item 2). The hole's
// position is the projection of the clash point on the member's axis (vector geometry); the check itself is
// lib/review/opening.ts (tested there against EN 1993-1-1 6.2.3); here: what counts as a change.
import { describe, expect, it } from "vitest";
import { analyzeModel } from "../analysis/analyze";
import { generateRoof } from "../analysis/generator";
import { clashOpeningCheck, openingCheckReason } from "./opening-recheck";

const model = generateRoof({ name: "Opening roof", spanX: 9, spanY: 9, module: 3, depth: 2 });
const result = analyzeModel(model);
const MEMBER = "TCY-1-0";
const member = model.members.find((m) => m.id === MEMBER)!;
const [a, b] = [member.i, member.j].map((id) => model.nodes.find((n) => n.id === id)!);
// A point a third along the chord, 0.2 m off its axis sideways (the duct's centre passes beside the axis).
const point = { x: a.x + (b.x - a.x) / 3 + 0.2, y: a.y + (b.y - a.y) / 3, z: a.z + (b.z - a.z) / 3 };
const resultsOf = (scale: number) =>
  Object.fromEntries(Object.entries(result.results).map(([id, r]) => [id, { force: scale * r.memberForces[MEMBER], zero: r.zeroForceMembers.includes(MEMBER) }]));
const check = (scale: number, diameter = 0.04, insulation = 0.005) =>
  clashOpeningCheck({ model, standard: "EN1993-1-1", memberId: MEMBER, run: { profile: { shape: "round", diameter }, insulation }, point, results: resultsOf(scale) })!;

describe("clashOpeningCheck", () => {
  it("checks a round hole as wide as the insulated run, where the clash point projects on the member's axis", () => {
    const assessment = check(1);
    expect(assessment.opening).toEqual({ shape: "round", diameter: 0.05, position: expect.closeTo(Math.hypot(b.x - a.x, b.y - a.y, b.z - a.z) / 3, 9) });
    expect(assessment.combinations.length).toBeGreaterThan(0);
  });

  it("is null for a member that is not in the model", () => {
    expect(clashOpeningCheck({ model, standard: "EN1993-1-1", memberId: "nope", run: { profile: { shape: "round", diameter: 0.05 }, insulation: 0 }, point, results: resultsOf(1) })).toBeNull();
  });
});

describe("openingCheckReason", () => {
  it("holds when nothing changed", () => {
    expect(openingCheckReason(check(1), check(1))).toBeNull();
  });

  it("names a changed verdict of the opening check, with the hole", () => {
    const before = check(1);
    const after = check(200);
    expect(before.verdict).toBe("within capacity on the checks made");
    expect(after.verdict).toBe("over capacity");
    expect(openingCheckReason(before, after)).toMatch(/^the opening check \(a 50 mm hole at \d+\.\d\d m\) was "within capacity on the checks made"; now "over capacity"$/);
  });

  it("names a change of utilisation beyond the tolerance (0.05) with the same verdict, not one within it", () => {
    const before = check(1);
    const slightly = check(1.5);
    const u = [before, slightly].map((x) => x.governing!.utilisationWith);
    expect(u[1] - u[0]).toBeLessThan(0.05);
    expect(openingCheckReason(before, slightly)).toBeNull();
    const after = check(10);
    const u1 = after.governing!.utilisationWith;
    expect(after.verdict).toBe(before.verdict);
    expect(u1 - u[0]).toBeGreaterThan(0.05);
    expect(openingCheckReason(before, after)).toBe(`the opening check (a 50 mm hole at ${before.opening.position.toFixed(2)} m) went from utilisation ${u[0].toFixed(2)} to ${u1.toFixed(2)}`);
  });
});
