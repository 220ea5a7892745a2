import { describe, expect, it } from "vitest";
import { analyzeModel, generateRoof, type TrussModel } from "@/lib/analysis";
import { STANDING_CAUTION } from "./caution";
import { createReviewContext } from "./context";
import { axialUtilisation } from "./design-checks/member-check";
import { removalWhatIf } from "./removal";
import { bracedColumn, prattTruss, prattWithExtras } from "@/tests/support/fixtures/review-models";

const contextFor = (model: TrussModel) => createReviewContext(model, analyzeModel(model), { standard: "EN1993-1-1" });

describe("removalWhatIf", () => {
  // check-values §5.3 Example 4, removal checks (computed): the Pratt truss is statically determinate, so deleting
  // U1L1 or U2L2 (zero-force in case 4a) leaves a rank-deficient equilibrium matrix: a mechanism.
  it.each([["U1L1", "L1"], ["U2L2", "U2"], ["L1L2", null]])("removing %s from the determinate Pratt truss leaves a mechanism", (member, node) => {
    const outcome = removalWhatIf(contextFor(prattTruss()), { remove: [member] });
    expect(outcome.mechanism).toBe(true);
    if (!outcome.mechanism) return;
    if (node) expect(outcome.instability.map((i) => i.node)).toContain(node);
    expect(outcome.instabilityText.length).toBeGreaterThan(0);
    expect(outcome.caution).toBe(STANDING_CAUTION);
  });

  it("names every joint the removal leaves moving, with a mode no remaining member resists (issue 15 item 1, removal what-if)", () => {
    // Without the bottom chord L1L2 the determinate Pratt truss (check-values §5.3 Example 4) splits: the left panel
    // swings about L0 and more than one joint moves. A mechanism mode is an inextensional motion: every remaining
    // member's elongation c·(v_j − v_i) is zero (first order), checked here member by member.
    const model = prattTruss();
    const outcome = removalWhatIf(contextFor(model), { remove: ["L1L2"] });
    expect(outcome.mechanism).toBe(true);
    if (!outcome.mechanism) return;
    expect(outcome.modes).toHaveLength(1);
    const [mode] = outcome.modes;
    expect(mode.kind).toBe("mechanism");
    expect(mode.joints.length).toBeGreaterThan(1);
    const index = new Map(model.nodes.map((n, k) => [n.id, k]));
    for (const m of model.members.filter((m) => m.id !== "L1L2")) {
      const a = model.nodes[index.get(m.i)!];
      const b = model.nodes[index.get(m.j)!];
      const L = Math.hypot(b.x - a.x, b.y - a.y, b.z - a.z);
      const [ia, ib] = [3 * index.get(m.i)!, 3 * index.get(m.j)!];
      const elongation = ((b.x - a.x) * (mode.shape[ib] - mode.shape[ia]) + (b.y - a.y) * (mode.shape[ib + 1] - mode.shape[ia + 1]) + (b.z - a.z) * (mode.shape[ib + 2] - mode.shape[ia + 2])) / L;
      expect(Math.abs(elongation), m.id).toBeLessThan(1e-9);
    }
    // every joint named moves in the shape, and the words list them all
    for (const joint of mode.joints) expect(outcome.instabilityText.join(" ")).toContain(joint.node);
  });

  it("removing an idle member leaves every other force unchanged", () => {
    const outcome = removalWhatIf(contextFor(prattWithExtras()), { remove: ["XS1"] });
    expect(outcome.mechanism).toBe(false);
    if (outcome.mechanism) return;
    for (const c of outcome.changes) expect(c.changedCount, c.result).toBe(0);
    expect(outcome.utilisation.changes).toEqual([]);
  });

  it("says a mechanism when too many of the idle members go", () => {
    expect(removalWhatIf(contextFor(prattWithExtras()), { remove: ["XS1", "XS2"] }).mechanism).toBe(true);
  });

  it("matches a fresh analysis of the reduced roof, self-weight included", () => {
    const roof = generateRoof({ spanX: 15, spanY: 12, module: 3, depth: 1.5 });
    const context = contextFor(roof);
    const remove = ["D-2-1-NE", "BCX-1-1"];
    const outcome = removalWhatIf(context, { remove, maxListed: 10_000 });
    expect(outcome.mechanism).toBe(false);
    if (outcome.mechanism) return;
    const reduced = { ...roof, members: roof.members.filter((m) => !remove.includes(m.id)) };
    const fresh = analyzeModel(reduced);
    for (const c of outcome.changes) {
      const expected = fresh.results[c.result].memberForces;
      const scale = Math.max(...Object.values(expected).map(Math.abs));
      for (const change of c.changes) expect(Math.abs(change.after - expected[change.member])).toBeLessThan(1e-8 * scale);
      // Unlisted members did not change: their intact force is the fresh one.
      const listed = new Set(c.changes.map((x) => x.member));
      for (const m of reduced.members) {
        if (!listed.has(m.id)) expect(Math.abs(context.result.results[c.result].memberForces[m.id] - expected[m.id])).toBeLessThan(1e-6 * scale);
      }
      expect(c.changedCount).toBeGreaterThan(0);
    }
  });

  it("on a regular grid, removing one diagonal loses no brace: every joint stays held (issue 15 item 3)", () => {
    // Counting members called five compression members unbraced here; the reduced lateral stiffness of B-2-1 and
    // T-3-2 across each of them stays far above the 4P/L a brace needs.
    const roof = generateRoof({ spanX: 15, spanY: 12, module: 3, depth: 1.5 });
    const outcome = removalWhatIf(contextFor(roof), { remove: ["D-2-1-NE"] });
    if (outcome.mechanism) throw new Error("unexpected mechanism");
    expect(outcome.lostBraces).toEqual([]);
  });

  it("removing the only adequate brace of a column: the joint loses its hold across x, re-checked with K = 2", () => {
    // bracedColumn: without MB, M is held along x by MD alone, 2e8·1e-8/3 = 0.667 kN/m < 4P/L = 20 kN/m.
    const model = bracedColumn();
    const context = contextFor(model);
    const outcome = removalWhatIf(context, { remove: ["MB"] });
    if (outcome.mechanism) throw new Error("unexpected mechanism");
    expect(outcome.lostBraces.map((l) => l.member).sort()).toEqual(["AM", "MT"]);
    for (const lost of outcome.lostBraces) {
      expect(lost.joints).toEqual(["M"]);
      expect(lost.restraints[0].stiffnessAfter).toBeCloseTo((2e8 * 1e-8) / 3, 6);
      expect(Math.abs(lost.restraints[0].direction[0])).toBeCloseTo(1, 9);
      const input = context.inputs[context.memberIndex.get(lost.member)!];
      expect(lost.utilisationWithoutBrace).toBeCloseTo(axialUtilisation("EN1993-1-1", { ...input, effectiveLengthFactor: 2 }, -10), 8);
    }
  });

  it("analyses an added load case before and after the removal", () => {
    const model = prattWithExtras();
    const outcome = removalWhatIf(contextFor(model), {
      remove: ["XS1"],
      addLoadCase: { id: "hang", name: "hanger at X", category: "services", selfWeight: false, nodalLoads: [{ node: "X", fx: 0, fy: 0, fz: -4 }] },
    });
    if (outcome.mechanism) throw new Error("unexpected mechanism");
    const hang = outcome.changes.find((c) => c.result === "hang")!;
    // With a load at X the remaining three members share it differently once XS1 is gone.
    expect(hang.changedCount).toBeGreaterThan(0);
    expect(hang.changes.every((c) => c.member.startsWith("X"))).toBe(true);
  });

  it("combines an added load case in added combinations, before and after", () => {
    const model = prattWithExtras();
    const hang = { id: "hang", name: "hanger at X", category: "services" as const, selfWeight: false, nodalLoads: [{ node: "X", fx: 0, fy: 0, fz: -4 }] };
    const outcome = removalWhatIf(contextFor(model), { remove: ["XS1"], addLoadCase: hang, addCombinations: [{ id: "C2", name: "4b + hang", factors: { "4b": 1, hang: 1 } }] });
    if (outcome.mechanism) throw new Error("unexpected mechanism");
    const c2 = outcome.changes.find((c) => c.result === "C2")!;
    const alone = outcome.changes.find((c) => c.result === "hang")!;
    // 4b is untouched by removing an idle member, so the combination changes exactly as the added case does.
    expect(c2.changes).toEqual(alone.changes);
    // Direct check of the "after" state: the reduced model analysed from scratch.
    const fresh = analyzeModel({ ...model, members: model.members.filter((m) => m.id !== "XS1"), loadCases: [...model.loadCases, hang], combinations: [] });
    for (const c of alone.changes) expect(c.after).toBeCloseTo(fresh.results.hang.memberForces[c.member], 9);
  });
});
