import { describe, expect, it } from "vitest";
import { ValidationError } from "@/lib/http/errors";
import { requestFromUploadedFiles } from "./uploaded-files";

describe("requestFromUploadedFiles", () => {
  it("names the line and column where an uploaded JSON model goes wrong (issue 17 item 13)", () => {
    const text = '{\n  "format": "truss-model/1",\n  "nodes": [\n    {"id": "A", "x": 0,}\n  ]\n}';
    let error: unknown;
    try {
      requestFromUploadedFiles([{ filename: "roof.json", contentType: "application/json", text }], undefined);
    } catch (caught) {
      error = caught;
    }
    expect(error).toBeInstanceOf(ValidationError);
    expect((error as ValidationError).message).toBe("roof.json is not valid JSON (line 4, column 24: a property name in double quotes was expected).");
  });
});
