import Papa from "papaparse";
import { describe, expect, it } from "vitest";
import { ENVELOPE_COLUMNS, envelopeCsv, MEMBER_FORCE_COLUMNS, memberForcesCsv, NODE_RESULT_COLUMNS, nodeResultsCsv, roundForce } from "./csv";
import { tripodReport } from "@/tests/support/fixtures/report";

// Read back with papaparse (a general-purpose CSV parser) and compared with the analysis result itself.
function parse(csv: string) {
  const parsed = Papa.parse<Record<string, string>>(csv, { header: true, skipEmptyLines: true });
  expect(parsed.errors).toEqual([]);
  return parsed;
}

describe("CSV exports", () => {
  const { model, result } = tripodReport();

  it("member forces: one row per member, forces to 0.01 kN of the stored result", () => {
    const { data, meta } = parse(memberForcesCsv(model, result, "ULS-1"));
    expect(meta.fields).toEqual([...MEMBER_FORCE_COLUMNS]);
    expect(data.map((row) => row.member)).toEqual(["AD", "BD", "CD", "AB"]);
    for (const row of data) {
      expect(Number(row.axial_force_kN)).toBe(roundForce(result.results["ULS-1"].memberForces[row.member]));
      expect(row.axial_force_kN).toMatch(/^-?\d+(\.\d{1,2})?$/);
    }
    // Hand statics of the tripod (see tests/support/fixtures/report.ts): 40.5 kN / (3 / sqrt(2)) = 19.09 kN in each leg, compression.
    expect(data[0].axial_force_kN).toBe("-19.09");
    expect(data.map((row) => row.state)).toEqual(["compression", "compression", "compression", "zero-force"]);
    expect(data[0]).toMatchObject({ node_i: "A", node_j: "D", section: "CHS-88.9x4.0", result: "ULS-1" });
  });

  it("rounds to 0.01 kN and never prints -0", () => {
    expect(roundForce(12.345678)).toBe(12.35);
    expect(roundForce(-0.001)).toBe(0);
    expect(Object.is(roundForce(-0.001), -0)).toBe(false);
    expect(roundForce(-7.126)).toBe(-7.13);
  });

  it("refuses a result the analysis does not have", () => {
    expect(() => memberForcesCsv(model, result, "ULS-9")).toThrow(/no result "ULS-9"/);
  });

  it("envelope: extremes and governing results per member, as stored", () => {
    const { data, meta } = parse(envelopeCsv(model, result));
    expect(meta.fields).toEqual([...ENVELOPE_COLUMNS]);
    const ad = data.find((row) => row.member === "AD")!;
    expect(Number(ad.max_tension_kN)).toBe(roundForce(result.envelope.AD.maxTension));
    expect(Number(ad.max_compression_kN)).toBe(roundForce(result.envelope.AD.maxCompression));
    expect(ad).toMatchObject({ zero_in_all: "false", governing_tension: "ULS-3", governing_compression: "ULS-1" });
    expect(data.find((row) => row.member === "AB")).toMatchObject({ zero_in_all: "true" });
  });

  it("node results: every node's displacement in mm and each support's reaction, matching hand statics", () => {
    const { data, meta } = parse(nodeResultsCsv(model, result, "ULS-1"));
    expect(meta.fields).toEqual([...NODE_RESULT_COLUMNS]);
    expect(data.map((row) => row.node)).toEqual(["A", "B", "C", "D"]);
    // Tripod statics: P = 40.5 kN down at D shared equally, Rz = 13.5 kN at each support; A's leg pushes it along +x
    // with N cos a = 19.09 / sqrt(2) = 13.5 kN, so Rx at A = -13.5 kN.
    expect(data[0]).toMatchObject({ supported: "true", reaction_fx_kN: "-13.5", reaction_fy_kN: "0", reaction_fz_kN: "13.5" });
    expect(data[3]).toMatchObject({ supported: "false", reaction_fx_kN: "", reaction_fz_kN: "" });
    expect(Number(data[3].uz_mm)).toBe(Math.round(result.results["ULS-1"].displacements.D.uz * 1e6) / 1000);
    expect(Number(data[3].uz_mm)).toBeLessThan(0);
    expect(() => nodeResultsCsv(model, result, "ULS-9")).toThrow(/no result "ULS-9"/);
  });
});
