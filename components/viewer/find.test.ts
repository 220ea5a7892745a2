import { describe, expect, it } from "vitest";
import { findById } from "./find";
import { prepareModel } from "./prepare";

// Invented model: a 3 m chord on the ground and a node 4 m above its start.
const prepared = prepareModel(
  {
    name: "find",
    nodes: [
      { id: "T-0-0", x: 0, y: 0, z: 0 },
      { id: "T-1-0", x: 3, y: 0, z: 0 },
      { id: "B-0-0", x: 0, y: 0, z: 4 },
    ],
    members: [{ id: "TCX-0-0", i: "T-0-0", j: "T-1-0", section: "s" }],
    supports: [],
    loadCases: [],
    combinations: [],
  },
  {},
);

describe("find a member or node by id", () => {
  it("finds a member with the sphere around it (centre at its midpoint, radius half its length)", () => {
    expect(findById(prepared, "TCX-0-0")).toEqual({ kind: "member", id: "TCX-0-0", centre: [1.5, 0, 0], radius: 1.5 });
  });

  it("finds a node, ignoring case and spaces around the id", () => {
    expect(findById(prepared, "  b-0-0 ")).toEqual({ kind: "node", id: "B-0-0", centre: [0, 0, 4], radius: 0 });
  });

  it("finds nothing for an unknown or empty id", () => {
    expect(findById(prepared, "TCX-9-9")).toBeNull();
    expect(findById(prepared, "   ")).toBeNull();
  });

  it("finds nothing, without throwing, for a hostile query (10 MB of text, a null byte, a lone surrogate)", () => {
    expect(findById(prepared, "T".repeat(10 * 1024 * 1024))).toBeNull();
    expect(findById(prepared, "TCX-0-0\u0000")).toBeNull();
    expect(findById(prepared, "\ud800")).toBeNull();
    expect(findById(prepared, "__proto__")).toBeNull();
  });
});
