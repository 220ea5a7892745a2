import { mkdtempSync, rmSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { afterAll, describe, expect, it } from "vitest";
import { runAnalyzeCli } from "@/tests/support/analyze-cli";
import { STANDING_CAUTION } from "./caution";
import { pointLoads, trussModel } from "@/tests/support/fixtures/analysis-models";
import { prattTruss } from "@/tests/support/fixtures/review-models";

const dir = mkdtempSync(join(tmpdir(), "strutroom-review-cli-"));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

const analyze = runAnalyzeCli;

describe("npm run analyze -- --review", { timeout: 60_000 }, () => {
  const file = join(dir, "pratt.json");
  writeFileSync(file, JSON.stringify(prattTruss()));

  it("adds the review under a top-level review key, standard as asked", () => {
    const out = analyze(file, "--review", "--standard", "AISC360-22");
    expect(out.code).toBe(0);
    const parsed = JSON.parse(out.stdout);
    expect(parsed.status).toBe("ok");
    expect(parsed.review.standard).toBe("AISC360-22");
    expect(parsed.review.caution).toBe(STANDING_CAUTION);
    const u2l2 = parsed.review.members.find((m: { member: string }) => m.member === "U2L2");
    expect(u2l2.verdict.verdict).toBe("stabilising"); // check-values §5.3 Ex. 4 removal checks
  });

  it("leaves the output unchanged without --review and refuses an unknown standard", () => {
    expect(JSON.parse(analyze(file).stdout).review).toBeUndefined();
    const bad = analyze(file, "--review", "--standard", "BS5950");
    expect(bad.code).toBe(1);
    expect(bad.stderr).toMatch(/--standard must be one of/);
  });

  it("reports the overall stability per design result and warns below αcr = 10 (EN 1993-1-1 5.2.1(3))", () => {
    // A shallow two-bar truss, bars from (±5, 0, 0) to the apex (0, 0, 0.5), EA = 2e5 kN, 100 kN down at the apex.
    // Closed form (derived in lib/analysis/buckling.test.ts): αcr = 2EA sin³θ / (P cos²θ) = 3.96, below 10.
    const shallow = trussModel({
      nodes: [
        ["A", -5, 0, 0],
        ["B", 5, 0, 0],
        ["C", 0, 0, 0.5],
      ],
      members: ["A-C", "B-C"],
      supports: [
        ["A", true, true, true],
        ["B", true, true, true],
        ["C", false, true, false],
      ],
      loadCases: [pointLoads("P", [["C", 0, 0, -100]])],
    });
    const shallowFile = join(dir, "shallow.json");
    writeFileSync(shallowFile, JSON.stringify(shallow));
    const out = analyze(shallowFile, "--review");
    expect(out.code).toBe(0);
    const stability = JSON.parse(out.stdout).review.overallStability;
    const theta = Math.atan2(0.5, 5);
    const expected = (2 * 2e5 * Math.sin(theta) ** 3) / (100 * Math.cos(theta) ** 2);
    expect(stability.limit).toBe(10);
    expect(stability.results[0].result).toBe("P");
    expect(stability.results[0].alphaCr).toBeCloseTo(expected, 4);
    expect(stability.results[0].modes[0].joints[0].node).toBe("C");
    expect(stability.results[0].modes[0].shape).toHaveLength(9);
    expect(stability.results[0].warning).toMatch(/^P: αcr = 3\.\d\d < 10: second-order effects must be taken into account \(EN 1993-1-1 5\.2\.1\(3\)\)/);
    expect(stability.lowest).toEqual({ result: "P", alphaCr: expect.closeTo(expected, 4) });
  });
});

describe("npm run analyze -- --review --any-load", { timeout: 60_000 }, () => {
  const file = join(dir, "pratt-any.json");
  writeFileSync(file, JSON.stringify(prattTruss()));

  it("certifies the members no top-layer load can make work (Pratt: the verticals at L1 and L3, statics in any-load.test.ts)", () => {
    const out = analyze(file, "--any-load");
    expect(out.code).toBe(0);
    const anyLoad = JSON.parse(out.stdout).review.anyLoad;
    expect(anyLoad.idleForAnyLoad.sort()).toEqual(["U1L1", "U3L3"]);
    expect(anyLoad.tolerance).toMatch(/zero-force/);
  });

  it("takes the loadable nodes as told and refuses unknown ones", () => {
    const all = analyze(file, "--any-load", "--loadable-nodes", "L0,L1,L2,L3,L4,U1,U2,U3");
    expect(JSON.parse(all.stdout).review.anyLoad.idleForAnyLoad).toEqual([]);
    const bad = analyze(file, "--any-load", "--loadable-nodes", "U1,NOPE");
    expect(bad.code).toBe(1);
    expect(bad.stderr).toMatch(/no node "NOPE"/);
  });
});
