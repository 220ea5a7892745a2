// Which action of the rule book starts (and so may retry) each kind of job; the retry route and the progress
// bar's retry button both ask here.
import type { Action } from "@/lib/permissions";

export const JOB_ACTIONS = { analysis: "analysis.run", any_load: "analysis.run", report: "report.make" } as const satisfies Record<"analysis" | "any_load" | "report", Action>;
