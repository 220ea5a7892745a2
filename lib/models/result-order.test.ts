import { describe, expect, it } from "vitest";
import { openingResultId, resultIds } from "./result-order";

// Invented names (demo-style data): what is checked is the order rule, not any value from outside.
const model = {
  loadCases: [{ id: "dead" }, { id: "snow" }, { id: "wind" }],
  combinations: [{ id: "ULS-1" }, { id: "ULS-2" }],
};

describe("the results a revision offers", () => {
  it("are its load cases, then its combinations, keeping only the stored ones", () => {
    expect(resultIds(model, ["ULS-2", "wind", "dead", "ULS-1"])).toEqual(["dead", "wind", "ULS-1", "ULS-2"]);
    expect(resultIds(model, ["gone"])).toEqual([]);
  });

  it("open with the first stored combination, else the first stored load case, else none", () => {
    expect(openingResultId(model, ["dead", "snow", "ULS-2", "ULS-1"])).toBe("ULS-1");
    expect(openingResultId(model, ["snow", "ULS-2"])).toBe("ULS-2");
    expect(openingResultId(model, ["wind", "snow"])).toBe("snow");
    expect(openingResultId(model, [])).toBeNull();
  });
});
