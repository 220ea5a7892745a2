import { describe, expect, it } from "vitest";
import { locateJsonError } from "./json-errors";

// Positions counted by hand in each text below; the grammar is RFC 8259 (JSON), which allows no comments and no
// trailing commas.
describe("locateJsonError", () => {
  it("is null for well-formed JSON", () => {
    expect(locateJsonError('{"a": [1, 2, {"b": null}]}')).toBeNull();
  });

  it("names line and column of an unexpected token (JSON.parse in Node 20 gives no position for it)", () => {
    expect(locateJsonError('{\n  "a": tru\n}')).toEqual({ line: 2, column: 8, message: "line 2, column 8: unexpected characters" });
  });

  it("finds a trailing comma, a missing brace at the end and a comment", () => {
    expect(locateJsonError("[1,2,]")?.message).toBe("line 1, column 6: a value was expected");
    expect(locateJsonError('{"a":1\n')?.line).toBe(2);
    expect(locateJsonError('{"a":1, // note\n"b":2}')?.message).toBe("line 1, column 9: comments are not allowed in JSON");
  });

  it("counts Windows line endings as one line break", () => {
    expect(locateJsonError('{\r\n"a":1,\r\n"b" 2}')).toMatchObject({ line: 3, column: 5 });
  });
});
