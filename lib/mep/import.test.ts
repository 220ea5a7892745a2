import { describe, expect, it } from "vitest";
import { parseRunsCsv, parseRunsJson, parseRunsFile } from "./import";

const header = "run,system,shape,diameter,width,height,rotation,insulation,clearance,weight_per_metre,x,y,z";

describe("parseRunsCsv", () => {
  it("reads runs from point rows, properties on the first row", () => {
    const csv = [
      header,
      "SA-01,supply air,round,0.5,,,,0.05,0.1,0.35,0,1.5,1",
      "SA-01,,,,,,,,,,12,1.5,1",
      "CT-01,cable tray,rectangular,,0.3,0.1,15,,0.05,0.25,0,4,1.2",
      "CT-01,cable tray,rectangular,,0.3,0.1,15,,0.05,0.25,6,4,1.2",
      "CT-01,,,,,,,,,,6,9,1.2",
    ].join("\n");
    const { runs, problems } = parseRunsCsv(csv);
    expect(problems).toEqual([]);
    expect(runs.map((r) => r.id)).toEqual(["SA-01", "CT-01"]);
    expect(runs[0]).toMatchObject({ system: "supply air", profile: { shape: "round", diameter: 0.5 }, insulation: 0.05, clearance: 0.1, weightPerMetre: 0.35 });
    expect(runs[0].points).toEqual([{ x: 0, y: 1.5, z: 1 }, { x: 12, y: 1.5, z: 1 }]);
    expect(runs[1].profile).toEqual({ shape: "rectangular", width: 0.3, height: 0.1, rotation: 15 });
    expect(runs[1].insulation).toBe(0);
    expect(runs[1].points).toHaveLength(3);
  });

  it("lists every problem with its line and field", () => {
    const csv = [
      header,
      "SA-01,supply air,round,abc,,,,0,0.1,0.35,0,0,1", // line 2: bad diameter
      "SA-01,,,,,,,,,,4,0,1",
      "CW-01,chilled water,round,0.1,,,,0,0,0.2,0,0,1", // line 4
      "CW-01,,,,,,,,,,0,0,1", // line 5: repeats the point
      "CW-01,extract air,,,,,,,,,0,3,1", // line 6: contradicting system
      "EA-01,extract air,round,0.3,,,,0,0,0.2,0,0,1", // line 7
      "EA-01,,,,,,,,,,0,3,x", // line 8: bad z
      ",,,,,,,,,,1,1,1", // line 9: no run id
      "XX-01,,round,0.2,,,,0,0,0.1,1,1,1", // line 10: no system, one point only
    ].join("\n");
    const { runs, problems } = parseRunsCsv(csv);
    expect(runs).toEqual([]);
    const at = (row: number) => problems.filter((p) => p.row === row).map((p) => p.field).sort();
    expect(at(2)).toEqual(["diameter"]);
    expect(at(5)).toEqual(["point"]);
    expect(problems.find((p) => p.row === 5)?.message).toMatch(/repeats point/);
    expect(at(6)).toEqual(["system"]);
    expect(at(8)).toEqual(["z"]);
    expect(at(9)).toEqual(["run"]);
    expect(at(10)).toEqual(["points", "system"]);
    // Sorted by line so the list reads top to bottom.
    expect(problems.map((p) => p.row)).toEqual([...problems.map((p) => p.row)].sort((a, b) => (a ?? 0) - (b ?? 0)));
  });

  it("names missing columns, and still lists the other rows' problems (issue 17 item 13)", () => {
    const { runs, problems } = parseRunsCsv("run,system,x,y\nA,b,1,2\nA,b,3,2");
    expect(runs).toEqual([]);
    expect(problems).toEqual([{ row: 1, field: "header", message: "Missing column(s): shape, weight_per_metre, z." }]);
    // z is missing: a negative diameter on line 2 and an unreadable x on line 3 are still listed, with their lines.
    const partial = parseRunsCsv("run,system,shape,diameter,weight_per_metre,x,y\nA,supply air,round,-0.5,0.2,0,0\nA,,,,,abc,0");
    expect(partial.runs).toEqual([]);
    expect(partial.problems.map((p) => `${p.row}:${p.field}`)).toEqual(["1:header", "2:diameter", "3:x"]);
  });

  it("cannot group rows without the run column, and says so", () => {
    const { problems } = parseRunsCsv("system,shape,x,y,z,weight_per_metre\nb,round,1,2,3,0.1");
    expect(problems).toEqual([{ row: 1, field: "header", message: "Missing column(s): run." }]);
  });
});

describe("parseRunsJson", () => {
  it("reads the mep-runs/1 format and lists problems by run position", () => {
    const text = JSON.stringify({
      format: "mep-runs/1",
      runs: [
        { id: "SP-01", system: "sprinkler", profile: { shape: "round", diameter: 0.1 }, weightPerMetre: 0.2, points: [{ x: 0, y: 0, z: 1 }, { x: 5, y: 0, z: 1 }] },
        { id: "SP-01", system: "sprinkler", profile: { shape: "round", diameter: 0.1 }, weightPerMetre: 0.2, points: [{ x: 0, y: 1, z: 1 }, { x: 5, y: 1, z: 1 }] },
        { id: "bad id!", system: "", profile: { shape: "oval" }, weightPerMetre: -1, points: [] },
      ],
    });
    const { runs, problems } = parseRunsJson(text);
    expect(runs.map((r) => r.id)).toEqual(["SP-01"]);
    expect(problems.filter((p) => p.row === 2).map((p) => p.field)).toEqual(["id"]);
    expect(problems.filter((p) => p.row === 3).map((p) => p.field).sort()).toEqual(["id", "points", "profile.shape", "system", "weightPerMetre"]);
  });

  it("rejects text that is not JSON or not our format", () => {
    expect(parseRunsJson("{").problems[0].field).toBe("json");
    // The line and column of the first syntax error (issue 17 item 13).
    expect(parseRunsJson('{\n"format": "mep-runs/1",\n"runs": [}').problems).toEqual([{ row: 3, field: "json", message: "Not valid JSON: line 3, column 10: a value was expected" }]);
    expect(parseRunsJson('{"format":"other","runs":[]}').problems[0].field).toBe("format");
  });

  it("is chosen by parseRunsFile for .json names", () => {
    expect(parseRunsFile('{"format":"mep-runs/1","runs":[]}', "runs.json")).toEqual({ runs: [], problems: [] });
    expect(parseRunsFile(`${header}\n`, "runs.csv")).toEqual({ runs: [], problems: [] });
  });
});
