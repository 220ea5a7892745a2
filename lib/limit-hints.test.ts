// The hints beside the forms state the numbers the server enforces (lib/limits.ts), so the two cannot drift.
import { describe, expect, it } from "vitest";
import { limitHints } from "./limit-hints";
import { generator, modelCounts, runCounts, runsFileChars, text } from "./limits";

const n = (value: number) => value.toLocaleString("en");

describe("limit hints", () => {
  it("name the enforced limits", () => {
    expect(limitHints.name).toContain(n(text.name));
    expect(limitHints.projectName).toContain(n(text.projectName));
    expect(limitHints.span).toBe(`${generator.span.min} to ${n(generator.span.max)} m.`);
    expect(limitHints.module).toBe(`${generator.module.min} to ${generator.module.max} m.`);
    expect(limitHints.generator).toContain(`${n(generator.nodes)} nodes and ${n(generator.members)} members`);
    expect(limitHints.upload).toContain("20 MB per file");
    expect(limitHints.upload).toContain(`${n(modelCounts.nodes)} nodes`);
    expect(limitHints.runsImport).toBe(`At most ${n(runCounts.runs)} runs, ${n(runCounts.pointsPerRun)} points a run and ${n(runCounts.points)} points in all; a file of up to ${n(runsFileChars)} characters.`);
  });
});
