import { describe, expect, it } from "vitest";
import { memberEnvelopeState } from "./envelope-state";

describe("memberEnvelopeState", () => {
  it("reads zero in all, low-force and load-bearing from the envelope and the threshold", () => {
    expect(memberEnvelopeState({ maxTension: 0, maxCompression: 0, zeroInAll: true }, 5)).toBe("zero_in_all");
    // Largest |N| = 4.9 kN (compression) < 5 kN threshold.
    expect(memberEnvelopeState({ maxTension: 1.2, maxCompression: -4.9, zeroInAll: false }, 5)).toBe("low_force");
    expect(memberEnvelopeState({ maxTension: 5.1, maxCompression: 0, zeroInAll: false }, 5)).toBe("load_bearing");
    expect(memberEnvelopeState(undefined, 5)).toBeNull();
  });
});
