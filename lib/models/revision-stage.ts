// How a revision stands for review (issue 16): the one the structural engineer marked current, an unstable one
// (never announced as if it were fine), or a draft. Pure, shared by pages and components.

export type RevisionStage = "current" | "unstable" | "draft";

export const REVISION_STAGE_LABELS: Record<RevisionStage, string> = {
  current: "current (for review)",
  unstable: "unstable",
  draft: "draft",
};

/** A revision's stage: unstable first (a current revision whose model is a mechanism is still unstable). */
export function revisionStage(r: { isCurrent: boolean; analysisStatus: "ok" | "unstable" | null }): RevisionStage {
  if (r.analysisStatus === "unstable") return "unstable";
  return r.isCurrent ? "current" : "draft";
}

/** The revision a page opens without ?revision=: the current one, else the newest (revisions come newest first). */
export function defaultRevision<R extends { number: number; isCurrent: boolean }>(revisions: R[]): R | undefined {
  return revisions.find((r) => r.isCurrent) ?? revisions[0];
}
