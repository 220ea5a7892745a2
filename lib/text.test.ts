import { describe, expect, it } from "vitest";
import { fileNameProblem, findUnstorableText, isStorableText } from "./text";

// PostgreSQL refuses U+0000 in text and jsonb (PostgreSQL manual, "JSON Types": "\u0000 is disallowed"); an
// unpaired surrogate has no UTF-8 encoding (Unicode Standard, section 3.9, "ill-formed code unit sequence").
describe("text PostgreSQL can store", () => {
  it("refuses null characters and unpaired surrogates, accepts paired ones", () => {
    expect(isStorableText("roof 🏗️ ü")).toBe(true);
    expect(isStorableText("a\u0000b")).toBe(false);
    expect(isStorableText("a\ud800")).toBe(false);
    expect(isStorableText("\udc00b")).toBe(false);
  });

  it("finds bad values and keys anywhere in parsed JSON, with their paths, and __proto__ keys", () => {
    const value = JSON.parse('{"a": [{"b": "x\\u0000"}], "c\\ud800": 1, "d": {"__proto__": 2}, "ok": "fine"}');
    expect(findUnstorableText(value).map((p) => p.path.join(".")).sort()).toEqual(["a.0.b", "c\ud800", "d.__proto__"].sort());
  });

  it("walks a 100,000-deep nesting without overflowing the stack", () => {
    let deep: unknown = "x\u0000";
    for (let k = 0; k < 100_000; k++) deep = [deep];
    expect(findUnstorableText(deep)).toHaveLength(1);
  });

  it("file names: no line breaks, no folder parts", () => {
    expect(fileNameProblem("runs level 2.csv")).toBeUndefined();
    expect(fileNameProblem("a\nb.csv")).toMatch(/line breaks/);
    expect(fileNameProblem("../../etc/passwd")).toMatch(/without folders/);
    expect(fileNameProblem("..")).toMatch(/without folders/);
    expect(fileNameProblem("a\\b.csv")).toMatch(/without folders/);
  });
});
