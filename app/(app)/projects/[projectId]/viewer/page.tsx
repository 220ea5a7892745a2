import type { Metadata } from "next";
import Link from "next/link";
import { notFound } from "next/navigation";
import { listRevisionsByProject } from "@/db/queries/models";
import { ProjectHeader } from "@/components/project/project-header";
import { ProjectNav } from "@/components/project/project-nav";
import { RevisionPicker } from "@/components/viewer/revision-picker";
import { LiveReview } from "@/components/session/live-review";
import { requirePageProject } from "@/lib/auth/page";

export const metadata: Metadata = { title: "3D viewer" };

/** Where browsers reach the realtime process (set by scripts/stack/services.mjs). */
function realtimeUrl(): string {
  const url = process.env.REALTIME_URL;
  if (!url) throw new Error("REALTIME_URL is not set.");
  return url;
}

export default async function ViewerPage({ params, searchParams }: PageProps<"/projects/[projectId]/viewer">) {
  const { projectId } = await params;
  const { revision, clash } = await searchParams;
  const { project } = await requirePageProject(projectId);
  const revisions = await listRevisionsByProject({ projectId });
  const requested = typeof revision === "string" ? Number(revision) : null;
  const number = requested ?? revisions[0]?.number ?? null;
  if (requested !== null && !revisions.some((r) => r.number === requested)) notFound();
  return (
    <div className="flex flex-col gap-4">
      <ProjectHeader project={project} />
      <ProjectNav projectId={project.id} current="viewer" />
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
          <RevisionPicker projectId={project.id} revisions={revisions.map((r) => ({ number: r.number, name: r.name }))} current={number} />
          <LiveReview key={number} projectId={project.id} revisionNumber={number} realtimeUrl={realtimeUrl()} focusClash={typeof clash === "string" ? clash : null} />
        </>
      )}
    </div>
  );
}
