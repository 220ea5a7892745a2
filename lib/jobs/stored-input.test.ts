import { describe, expect, it } from "vitest";
import { reportJobInputSchema } from "../report/schemas";
import { readStoredJobInput } from "./stored-input";

const whatToDo = "ask for a new report on the report page.";

describe("reading a job's stored request", () => {
  it("answers the request when it fits", () => {
    expect(readStoredJobInput(reportJobInputSchema, { revision: 2, combinations: ["ULS-1"], compare: null }, whatToDo)).toEqual({ revision: 2, combinations: ["ULS-1"], compare: null });
  });

  it("fails in plain words, naming the wrong fields and what to do, without zod's dump", () => {
    // The whole message: no issue codes, types or JSON, only the fields and what to do.
    const read = () => readStoredJobInput(reportJobInputSchema, { revision: "two", combinations: "ULS-1", compare: null, extra: 1 }, whatToDo);
    expect(read).toThrow(new Error("the request stored with this job cannot be read (wrong: revision, combinations, extra (not expected)), so retrying it would fail the same way; ask for a new report on the report page."));
  });
});
