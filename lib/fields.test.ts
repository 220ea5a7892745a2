import { describe, expect, it } from "vitest";
import { revisionNumber, revisionNumberText } from "./fields";

// PostgreSQL `integer` is 4 bytes, -2147483648 to +2147483647 (PostgreSQL manual, "Numeric Types", Table 8.2).
describe("revision numbers are bounded by the integer column", () => {
  it("accepts 1 and 2147483647, refuses 0, 2147483648, 99999999999, fractions and text with a message", () => {
    expect(revisionNumber.parse(1)).toBe(1);
    expect(revisionNumberText.parse("2147483647")).toBe(2147483647);
    for (const bad of ["0", "2147483648", "99999999999", "1.5", "abc", "1e400"]) {
      const parsed = revisionNumberText.safeParse(bad);
      expect(parsed.success, bad).toBe(false);
      expect(parsed.error?.issues[0].message).toMatch(/whole numbers from 1 to 2147483647/);
    }
  });
});
