import type { Metadata } from "next";
import Link from "next/link";
import { notFound } from "next/navigation";
import { listRevisionsByProject } from "@/db/queries/models";
import { RevisionStageBadge } from "@/components/revision/revision-stage-badge";
import { RevisionPicker } from "@/components/viewer/revision-picker";
import { LiveReview } from "@/components/session/live-review";
import { requirePageProject } from "@/lib/auth/page";
import { defaultRevision } from "@/lib/models/revision-stage";
import { realtimeUrl } from "@/lib/realtime/browser-url";

export const metadata: Metadata = { title: "3D viewer" };

export default async function ViewerPage({ params, searchParams }: PageProps<"/projects/[projectId]/viewer">) {
  const { projectId } = await params;
  const { revision, clash } = await searchParams;
  const { project } = await requirePageProject(projectId);
  const revisions = await listRevisionsByProject({ projectId });
  const requested = typeof revision === "string" ? Number(revision) : null;
  const number = requested ?? defaultRevision(revisions)?.number ?? null;
  if (requested !== null && !revisions.some((r) => r.number === requested)) notFound();
  const shown = revisions.find((r) => r.number === number);
  return (
    <div className="flex flex-col gap-3">
      {number === null ? (
        <p className="text-sm text-board-700" data-testid="viewer-empty">
          This project has no model yet.{" "}
          <Link className="text-tension underline" href={`/projects/${project.id}/models`}>
            Generate or upload one
          </Link>
          .
        </p>
      ) : (
        <>
          <div className="flex flex-wrap items-center gap-2">
            <RevisionPicker projectId={project.id} revisions={revisions.map(({ number, name, isCurrent, analysisStatus }) => ({ number, name, isCurrent, analysisStatus }))} current={number} />
            {shown && <RevisionStageBadge revision={shown} />}
          </div>
          <LiveReview key={number} projectId={project.id} revisionNumber={number} realtimeUrl={realtimeUrl()} focusClash={typeof clash === "string" ? clash : null} />
        </>
      )}
    </div>
  );
}
