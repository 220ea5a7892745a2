// The kinds of heavy work the jobs process does, defined once: the `job_kind` enum of the jobs table, the queue and
// the rule-book actions of each kind are keyed by these.
export const JOB_KINDS = ["analysis", "any_load", "report", "hang_services"] as const;
export type JobKind = (typeof JOB_KINDS)[number];
