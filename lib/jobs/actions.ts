// Which actions of the rule book start (and so may retry) each kind of job; the retry route and the progress bar's
// retry button both ask here. Hanging the services makes a new revision and its analysis: both permissions, as the
// hang route asks.
import type { JobKind } from "@/lib/jobs/kinds";
import type { Action } from "@/lib/permissions";

export const JOB_ACTIONS = {
  analysis: ["analysis.run"],
  any_load: ["analysis.run"],
  report: ["report.make"],
  hang_services: ["model.edit", "analysis.run"],
} as const satisfies Record<JobKind, readonly Action[]>;
