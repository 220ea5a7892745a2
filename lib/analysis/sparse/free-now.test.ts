import { describe, expect, it } from "vitest";
import { freeNow } from "./free-now";

describe("freeNow", () => {
  it("detaches the arrays' buffers and leaves other arrays alone", () => {
    const a = new Float64Array(1000).fill(1);
    const b = new Int32Array(10).fill(2);
    const kept = new Float64Array(5).fill(3);
    freeNow(a, b);
    // a detached buffer has no bytes left (ECMAScript IsDetachedBuffer: byteLength reads 0) and its views read as empty
    expect(a.buffer.byteLength).toBe(0);
    expect(a.length).toBe(0);
    expect(b.length).toBe(0);
    expect([...kept]).toEqual([3, 3, 3, 3, 3]);
  });
});
