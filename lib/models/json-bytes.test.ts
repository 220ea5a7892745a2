// jsonBytes against the reference it must equal byte for byte: the JavaScript engine's own JSON.stringify
// (ECMAScript's JSON.stringify, SerializeJSONObject / SerializeJSONArray) encoded as UTF-8 by Node's Buffer.
import { describe, expect, it } from "vitest";
import { analyzeModel, generateRoof } from "@/lib/analysis";
import { reviewForStorage } from "./analyse";
import { jsonBytes } from "./json-bytes";

const reference = (value: unknown) => new Uint8Array(Buffer.from(JSON.stringify(value)));
const many = <T>(n: number, make: (k: number) => T): T[] => Array.from({ length: n }, (_, k) => make(k));

describe("jsonBytes", () => {
  it("writes the stored analysis and review of a generated roof exactly as JSON.stringify does", () => {
    const model = generateRoof({ name: "Unit grid", spanX: 12, spanY: 9, module: 3, depth: 1.5 });
    const result = analyzeModel(model);
    const review = reviewForStorage(model, result, "EN1993-1-1");
    expect(model.members.length).toBeGreaterThan(32);
    for (const document of [result, review, model]) expect(jsonBytes(document)).toEqual(reference(document));
  });

  it("leaves out what JSON.stringify leaves out of large objects, and writes null for it in large arrays", () => {
    const odd = [undefined, () => 1, Symbol("s"), Number.NaN, Infinity, -0, null, new Date(0), "é ☃ 𝄞 \" \\ \n"];
    const object = Object.fromEntries(many(100, (k): [string, unknown] => [`k${k}`, odd[k % odd.length]]));
    const array = many(100, (k) => odd[k % odd.length]);
    for (const value of [object, array, { nested: { object, array } }, [[array]]]) expect(jsonBytes(value)).toEqual(reference(value));
  });

  it("keeps JSON.stringify's key order (integer keys first) and its escapes in keys", () => {
    const object = Object.fromEntries(many(64, (k): [string, unknown] => [k % 2 ? `m-${k}` : String(64 - k), k]));
    object['quote " and \\ and ☃'] = "x";
    expect(jsonBytes(object)).toEqual(reference(object));
  });

  it("writes small values and empty containers as JSON.stringify does", () => {
    for (const value of [0, 1.5e-300, "text", true, null, [], {}, [1, "two"], { a: [] }]) expect(jsonBytes(value)).toEqual(reference(value));
  });
});
