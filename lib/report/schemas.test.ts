import { describe, expect, it } from "vitest";
import { reportJobInputSchema, reportRequestSchema } from "./schemas";

describe("report request", () => {
  it("takes a revision, the results in order and an optional comparison", () => {
    expect(reportRequestSchema.parse({ revision: 2, combinations: ["ULS-1", "ULS-2"], compare: ["ULS-1", "ULS-3"] })).toEqual({ revision: 2, combinations: ["ULS-1", "ULS-2"], compare: ["ULS-1", "ULS-3"] });
    expect(reportRequestSchema.parse({})).toEqual({});
    expect(reportRequestSchema.parse({ compare: null })).toEqual({ compare: null });
  });

  it("refuses a comparison of anything but two results, a bad revision, an unknown key and a reserved name, each named", () => {
    const failed = reportRequestSchema.safeParse({ revision: 0, compare: ["ULS-1"], combinations: ["__proto__"], extra: 1 });
    expect(failed.error?.issues.map((i) => i.path.join("."))).toEqual(expect.arrayContaining(["revision", "compare", "combinations.0", ""]));
    expect(failed.error?.issues.find((i) => i.path[0] === "compare")?.message).toBe("Compare exactly two results.");
  });

  it("refuses a result named twice (it would be drawn twice), naming it", () => {
    const failed = reportRequestSchema.safeParse({ combinations: ["ULS-1", "ULS-2", "ULS-1", "ULS-1"] });
    expect(failed.error?.issues.map((i) => [i.path.join("."), i.message])).toEqual([["combinations", "Name each result once: ULS-1 is named twice."]]);
  });

  it("stores a job's input resolved: the revision and results always present", () => {
    expect(reportJobInputSchema.safeParse({ revision: 1, combinations: [] , compare: null }).success).toBe(true);
    expect(reportJobInputSchema.safeParse({ revision: 1, combinations: [] }).success).toBe(false);
  });
});
