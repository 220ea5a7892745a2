// The column encoding checked against the design-format JSON of the same analysis (a small generated grid of our
// own): this checks the packing and its order, not the solver, which has its own reference tests.
import { describe, expect, it } from "vitest";
import { analyzeModel, generateRoof } from "@/lib/analysis";
import { bitAt, encodeResultColumns, packBits, packWire, unpackWire, VERDICT_CODES } from "./result-columns";
import { reviewForStorage } from "./analyse";

const model = generateRoof({ name: "Unit grid", spanX: 6, spanY: 6, module: 3, depth: 1.5 });
const result = analyzeModel(model);

describe("result columns", () => {
  it("packs flags into bits, bit k % 8 of byte k / 8", () => {
    const bits = packBits(11, (k) => k === 0 || k === 9 || k === 10);
    expect([...bits]).toEqual([0b1, 0b110]);
    expect([0, 1, 9, 10].map((k) => bitAt(bits, k))).toEqual([1, 0, 1, 1]);
  });

  it("round-trips every result through the wire body in member and node order", () => {
    const review = reviewForStorage(model, result, "EN1993-1-1")!;
    const { results, run } = encodeResultColumns(model, result, review);
    expect(results.map((r) => r.resultId)).toEqual(Object.keys(result.results));
    for (const columns of results) {
      const wire = unpackWire(packWire(columns, run).slice().buffer);
      const json = result.results[columns.resultId];
      expect(wire.hasReview).toBe(true);
      model.members.forEach((member, k) => {
        expect(wire.forces[k]).toBe(Math.fround(json.memberForces[member.id]));
        expect(bitAt(wire.zero, k)).toBe(json.zeroForceMembers.includes(member.id) ? 1 : 0);
        expect(VERDICT_CODES[wire.verdicts[k] - 1]).toBe(review.members[member.id].verdict);
      });
      const last = model.nodes.length - 1;
      expect(wire.displacements[last * 3 + 2]).toBe(Math.fround(json.displacements[model.nodes[last].id].uz));
    }
  });

  it("marks a run without review: NaN utilisation and no verdicts", () => {
    const { results, run } = encodeResultColumns(model, result, null);
    const wire = unpackWire(packWire(results[0], run).slice().buffer);
    expect(wire.hasReview).toBe(false);
    expect(Number.isNaN(wire.utilisation[0])).toBe(true);
    expect(wire.verdicts.every((code) => code === 0)).toBe(true);
  });

  it("refuses a body that is truncated or not ours", () => {
    const { results, run } = encodeResultColumns(model, result, null);
    const body = packWire(results[0], run);
    expect(() => unpackWire(body.slice(0, body.length - 4).buffer)).toThrow(/truncated/);
    expect(() => unpackWire(new Uint8Array(64).buffer)).toThrow(/format/);
    expect(() => unpackWire(new Uint8Array(3).buffer)).toThrow(/truncated/);
  });
});
