import type { Metadata } from "next";
import Link from "next/link";
import { notFound } from "next/navigation";
import { ClashBoard } from "@/components/clashes/clash-board";
import { ClashRevisionPicker } from "@/components/clashes/clash-revision-picker";
import { RevisionStageBadge } from "@/components/revision/revision-stage-badge";
import { listRevisionsByProject } from "@/db/queries/models";
import { requirePageProject } from "@/lib/auth/page";
import { defaultRevision } from "@/lib/models/revision-stage";
import { realtimeUrl } from "@/lib/realtime/browser-url";

export const metadata: Metadata = { title: "Clashes" };

export default async function ClashesPage({ params, searchParams }: PageProps<"/projects/[projectId]/clashes">) {
  const { projectId } = await params;
  const { revision, clash } = await searchParams;
  const { project } = await requirePageProject(projectId);
  const revisions = await listRevisionsByProject({ projectId });
  const requested = typeof revision === "string" ? Number(revision) : null;
  if (requested !== null && !revisions.some((r) => r.number === requested)) notFound();
  const number = requested ?? defaultRevision(revisions)?.number ?? null;
  const shown = revisions.find((r) => r.number === number);
  return (
    <div className="flex flex-col gap-4">
      {number === null ? (
        <p className="text-sm text-board-700" data-testid="clashes-empty">
          This project has no model yet, so there is nothing for runs to clash with.{" "}
          <Link className="text-tension underline" href={`/projects/${project.id}/models`}>
            Generate or upload one
          </Link>
          .
        </p>
      ) : (
        <>
          <div className="flex flex-wrap items-center gap-2">
            <ClashRevisionPicker projectId={project.id} revisions={revisions.map(({ number, name, isCurrent, analysisStatus }) => ({ number, name, isCurrent, analysisStatus }))} current={number} />
            {shown && <RevisionStageBadge revision={shown} />}
          </div>
          <ClashBoard key={number} projectId={project.id} revision={number} realtimeUrl={realtimeUrl()} otherRevisions={revisions.map((r) => r.number).filter((n) => n !== number)} initialClash={typeof clash === "string" ? clash : null} />
        </>
      )}
    </div>
  );
}
