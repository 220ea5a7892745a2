// The limits of lib/limits.ts as the forms show them beside their fields (issue 21 item 1): one sentence per form,
// so what a form says and what the server refuses cannot drift apart. Pure: no I/O.
import { formatBytes, generator, modelCounts, modelFileBytes, runCounts, runsFileChars, text } from "./limits";

const count = (n: number) => n.toLocaleString("en");

export const limitHints = {
  /** Revision and roof names. */
  name: `Up to ${count(text.name)} characters.`,
  projectName: `Up to ${count(text.projectName)} characters.`,
  description: `Up to ${count(text.description)} characters.`,
  personName: `Up to ${count(text.personName)} characters.`,
  span: `${generator.span.min} to ${count(generator.span.max)} m.`,
  module: `${generator.module.min} to ${generator.module.max} m.`,
  depth: `${generator.depth.min} to ${generator.depth.max} m.`,
  generator: `The grid is counted before it is built: at most ${count(generator.nodes)} nodes and ${count(generator.members)} members (a finer module on a larger span is refused).`,
  upload: `Up to ${formatBytes(modelFileBytes)} per file and at most ${count(modelCounts.nodes)} nodes, ${count(modelCounts.members)} members, ${modelCounts.loadCases} load cases and ${modelCounts.combinations} combinations per model.`,
  runsImport: `At most ${count(runCounts.runs)} runs, ${count(runCounts.pointsPerRun)} points a run and ${count(runCounts.points)} points in all; a file of up to ${count(runsFileChars)} characters.`,
} as const;
