import { describe, expect, it } from "vitest";
import { globalIdFromBytes, isGlobalId, memberGlobalId } from "./guid";

describe("IFC GlobalIds", () => {
  it("writes 128 bits as 22 characters of the IFC alphabet (all zeros and all ones: common practice, from memory)", () => {
    expect(globalIdFromBytes(new Uint8Array(16))).toBe("0000000000000000000000");
    expect(globalIdFromBytes(new Uint8Array(16).fill(255))).toBe("3$$$$$$$$$$$$$$$$$$$$$");
  });
  it("keeps a member id that already is a GlobalId and derives a stable one otherwise", () => {
    expect(memberGlobalId("1AAAAAAAAAAAAAAAAAAA$1")).toBe("1AAAAAAAAAAAAAAAAAAA$1");
    expect(memberGlobalId("T12")).toBe(memberGlobalId("T12"));
    expect(isGlobalId(memberGlobalId("T12"))).toBe(true);
    expect(memberGlobalId("T12")).not.toBe(memberGlobalId("T13"));
  });
});
