import Papa from "papaparse";
import { describe, expect, it } from "vitest";
import { ENVELOPE_COLUMNS, envelopeCsv, MEMBER_FORCE_COLUMNS, memberForcesCsv } from "./csv";
import { tripodReport } from "./test-report";

// Read back with papaparse (a general-purpose CSV parser) and compared with the analysis result itself.
function parse(csv: string) {
  const parsed = Papa.parse<Record<string, string>>(csv, { header: true, skipEmptyLines: true });
  expect(parsed.errors).toEqual([]);
  return parsed;
}

describe("CSV exports", () => {
  const { model, result } = tripodReport();

  it("member forces: one row per member, full-precision forces equal to the stored result", () => {
    const { data, meta } = parse(memberForcesCsv(model, result, "ULS-1"));
    expect(meta.fields).toEqual([...MEMBER_FORCE_COLUMNS]);
    expect(data.map((row) => row.member)).toEqual(["AD", "BD", "CD", "AB"]);
    for (const row of data) expect(Number(row.axial_force_kN)).toBe(result.results["ULS-1"].memberForces[row.member]);
    // Hand statics of the tripod (see test-report.ts): 40.5 kN / (3 / sqrt(2)) in each leg, compression.
    expect(Number(data[0].axial_force_kN)).toBeCloseTo(-(40.5 * Math.SQRT2) / 3, 9);
    expect(data.map((row) => row.state)).toEqual(["compression", "compression", "compression", "zero-force"]);
    expect(data[0]).toMatchObject({ node_i: "A", node_j: "D", section: "CHS-88.9x4.0", result: "ULS-1" });
  });

  it("refuses a result the analysis does not have", () => {
    expect(() => memberForcesCsv(model, result, "ULS-9")).toThrow(/no result "ULS-9"/);
  });

  it("envelope: extremes and governing results per member, as stored", () => {
    const { data, meta } = parse(envelopeCsv(model, result));
    expect(meta.fields).toEqual([...ENVELOPE_COLUMNS]);
    const ad = data.find((row) => row.member === "AD")!;
    expect(Number(ad.max_tension_kN)).toBe(result.envelope.AD.maxTension);
    expect(Number(ad.max_compression_kN)).toBe(result.envelope.AD.maxCompression);
    expect(ad).toMatchObject({ zero_in_all: "false", governing_tension: "ULS-3", governing_compression: "ULS-1" });
    expect(data.find((row) => row.member === "AB")).toMatchObject({ zero_in_all: "true" });
  });
});
