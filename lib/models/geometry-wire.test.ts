// The geometry body checked against the model it was packed from (a small generated grid of our own) and against
// the member counts of a square-on-square double-layer grid of N x N top bays (common practice, counted by hand:
// top chords 2N(N+1), bottom chords 2N(N-1) on the (N-1) x (N-1) offset bottom grid, diagonals 4 per top bay, 4N²).
import { describe, expect, it } from "vitest";
import { generateRoof } from "@/lib/analysis";
import { classifyMembers } from "@/lib/analysis/classify";
import { MEMBER_KIND_CODES, packGeometry, unpackGeometry } from "./geometry-wire";

const bays = 3;
const model = generateRoof({ name: "Unit grid", spanX: bays * 3, spanY: bays * 3, module: 3, depth: 1.5 });

describe("roof geometry wire", () => {
  it("round-trips coordinates, ends, sections and ids in model order", () => {
    const wire = unpackGeometry(packGeometry(model).slice().buffer);
    expect(wire.nodeIds).toEqual(model.nodes.map((n) => n.id));
    expect(wire.memberIds).toEqual(model.members.map((m) => m.id));
    model.nodes.forEach((node, k) => expect([...wire.coordinates.subarray(3 * k, 3 * k + 3)]).toEqual([Math.fround(node.x), Math.fround(node.y), Math.fround(node.z)]));
    model.members.forEach((member, k) => {
      expect(wire.nodeIds[wire.ends[2 * k]]).toBe(member.i);
      expect(wire.nodeIds[wire.ends[2 * k + 1]]).toBe(member.j);
      expect(wire.sectionIds[wire.sections[k]]).toBe(member.section);
    });
  });

  it("codes each member's kind as the classifier does, with the counts of a square-on-square grid", () => {
    const wire = unpackGeometry(packGeometry(model).slice().buffer);
    const classes = classifyMembers(model);
    model.members.forEach((member, k) => expect(MEMBER_KIND_CODES[wire.kinds[k]]).toBe(classes[member.id]));
    const count = (kind: string) => [...wire.kinds].filter((code) => MEMBER_KIND_CODES[code] === kind).length;
    expect(count("top_chord")).toBe(2 * bays * (bays + 1));
    expect(count("bottom_chord")).toBe(2 * bays * (bays - 1));
    expect(count("diagonal")).toBe(4 * bays * bays);
  });

  it("refuses a body that is truncated or not geometry", () => {
    const body = packGeometry(model);
    expect(() => unpackGeometry(body.slice(0, body.byteLength - 1).buffer)).toThrow(/truncated/);
    expect(() => unpackGeometry(new Uint8Array(8).buffer)).toThrow(/truncated/);
    const other = body.slice();
    other[0] = 0;
    expect(() => unpackGeometry(other.buffer)).toThrow(/expected format/);
  });
});
