import { describe, expect, it } from "vitest";
import { defaultCompareResult } from "./prepare";

describe("the result compare mode starts with", () => {
  // Display order: load cases, then combinations (resultIds in lib/models/result-order.ts).
  const ids = ["dead", "snow", "ULS-1", "ULS-2", "ULS-3"];

  it("is the next result after the chosen one, or the one before for the last", () => {
    expect(defaultCompareResult(ids, "ULS-1")).toBe("ULS-2");
    expect(defaultCompareResult(ids, "ULS-3")).toBe("ULS-2");
    expect(defaultCompareResult(ids, "dead")).toBe("snow");
  });

  it("is never the chosen result itself, and none when there is no other", () => {
    expect(defaultCompareResult(["ULS-1"], "ULS-1")).toBeNull();
    expect(defaultCompareResult(ids, null)).toBe("dead");
    expect(defaultCompareResult(ids, "gone")).toBe("dead");
  });
});
