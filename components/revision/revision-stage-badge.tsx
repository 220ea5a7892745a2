import { REVISION_STAGE_LABELS, revisionStage } from "@/lib/models/revision-stage";

const STAGE_CLASSES = {
  current: "border-board-800 bg-board-800 text-white",
  // Unstable in the caution colour, never green.
  unstable: "border-compression bg-compression/10 text-compression",
  draft: "border-board-200 bg-board-50 text-board-700",
} as const;

/** A small label saying whether a revision is current (for review), unstable or a draft. */
export function RevisionStageBadge({ revision }: { revision: { isCurrent: boolean; analysisStatus: "ok" | "unstable" | null } }) {
  const stage = revisionStage(revision);
  return (
    <span className={`rounded border px-1.5 py-0.5 text-xs font-medium ${STAGE_CLASSES[stage]}`} data-testid="revision-stage" data-stage={stage}>
      {REVISION_STAGE_LABELS[stage]}
    </span>
  );
}
