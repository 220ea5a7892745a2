import { describe, expect, it } from "vitest";
import { reportQueryFrom, reportQuerySchema } from "./schemas";

const parse = (query: string) => reportQuerySchema.safeParse(reportQueryFrom(new URLSearchParams(query)));

describe("report query", () => {
  it("reads comma lists and repeated keys (the report form's checkboxes) alike", () => {
    expect(parse("revision=2&combinations=ULS-1,ULS-2&compare=ULS-1,ULS-3").data).toEqual({ revision: 2, combinations: ["ULS-1", "ULS-2"], compare: ["ULS-1", "ULS-3"] });
    expect(parse("combinations=ULS-1&combinations=ULS-2&compare=ULS-1&compare=ULS-3&compare=").data).toEqual({ combinations: ["ULS-1", "ULS-2"], compare: ["ULS-1", "ULS-3"] });
    expect(parse("").data).toEqual({});
  });

  it("refuses a comparison of anything but two results, and a bad revision", () => {
    expect(parse("compare=ULS-1").error?.issues[0]).toMatchObject({ path: ["compare"], message: "Compare exactly two results, as compare=a,b." });
    expect(parse("revision=0").error?.issues[0].path).toEqual(["revision"]);
  });
});
