import Papa from "papaparse";
import { describe, expect, it } from "vitest";
import { clashesCsv, type ClashCsvRow } from "./csv";

const row: ClashCsvRow = { clashKey: "c1", memberId: "D-1", runId: "SA-01", segmentIndex: 0, kind: "hard", status: "active", depth: 0.0234, outcome: "opening_accepted", decidedAt: "2026-12-01T10:00:00Z", proposedBy: "Ines", decidedBy: "Tomasz", conditions: "Sleeve 250 mm", note: "", recheckReason: null, closedReason: null, assignee: "Ines", dueOn: "2027-01-15" };

describe("clash CSV export", () => {
  it("writes one row per clash, read back by papaparse (RFC 4180)", () => {
    const parsed = Papa.parse<string[]>(clashesCsv([row]).trim());
    expect(parsed.data[1]).toEqual(["c1", "D-1", "SA-01", "1", "hard", "active", "23", "Opening accepted with conditions", "decided", "Ines", "Tomasz", "Sleeve 250 mm", "", "", "Ines", "2027-01-15"]);
  });

  it("escapes text a spreadsheet would run as a formula (OWASP CSV injection), multi-line cells too", () => {
    const hostile = { ...row, conditions: '=HYPERLINK("http://x","y")', assignee: "@SUM(1)", outcome: "opening_accepted" as const, note: "" };
    const multi = { ...row, clashKey: "c2", conditions: "+1\n=2" };
    const parsed = Papa.parse<string[]>(clashesCsv([hostile, multi]).trim());
    expect(parsed.data[1][11]).toBe(`'=HYPERLINK("http://x","y")`);
    expect(parsed.data[1][14]).toBe("'@SUM(1)");
    expect(parsed.data[2][11]).toBe("'+1\n=2");
  });
});
