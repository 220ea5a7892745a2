import { REVISION_STAGE_LABELS, revisionStage } from "@/lib/models/revision-stage";

const STAGE_CLASSES = {
  current: "border-board-800 bg-board-800 text-white",
  // Unstable in the caution colour (border and tint), never green; the text stays dark because the caution colour
  // as text on its own tint fails WCAG 2.1 contrast (axe-core).
  unstable: "border-compression bg-compression/10 text-board-900",
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
