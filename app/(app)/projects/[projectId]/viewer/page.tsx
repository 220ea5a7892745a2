import type { Metadata } from "next";
import Link from "next/link";
import { notFound } from "next/navigation";
import { listRevisionsByProject } from "@/db/queries/models";
import { getRevisionResultNames } from "@/db/queries/revision-view";
import { RevisionStageBadge } from "@/components/revision/revision-stage-badge";
import { RevisionPicker } from "@/components/viewer/revision-picker";
import { LiveReview } from "@/components/session/live-review";
import { requirePageProject } from "@/lib/auth/page";
import { defaultRevision } from "@/lib/models/revision-stage";
import { openingResultId } from "@/lib/models/result-order";
import { revisionUrls } from "@/lib/models/viewer-urls";
import { realtimeUrl } from "@/lib/realtime/browser-url";

export const metadata: Metadata = { title: "3D viewer" };

/**
 * The viewer's first three requests (overview, geometry, the opening result's columns), started from the page's
 * HTML side by side while the scripts download and hydrate: the viewer's own fetches of the same addresses then take
 * the preloaded answers instead of asking only after hydration, one after the other (issue 13 navigation). Rendered
 * as <link> elements (React places them in the <head> of the HTML): react-dom's preload() from a server component
 * reached the page only through the RSC payload, after the scripts ran. `crossOrigin="anonymous"` gives the preload
 * the same request mode and credentials as the viewer's fetch(), which a preload needs to be used.
 */
async function openingFetches(projectId: string, number: number): Promise<{ preloads: string[]; opening: string | null }> {
  const urls = revisionUrls(projectId, number);
  const names = await getRevisionResultNames({ projectId, number });
  const opening = names ? openingResultId(names, names.stored) : null;
  return { preloads: [urls.summary, urls.geometry, ...(opening ? [urls.resultColumns(opening)] : [])], opening };
}

export default async function ViewerPage({ params, searchParams }: PageProps<"/projects/[projectId]/viewer">) {
  const { projectId } = await params;
  const { revision, clash } = await searchParams;
  const { project } = await requirePageProject(projectId);
  const revisions = await listRevisionsByProject({ projectId });
  const requested = typeof revision === "string" ? Number(revision) : null;
  const number = requested ?? defaultRevision(revisions)?.number ?? null;
  if (requested !== null && !revisions.some((r) => r.number === requested)) notFound();
  const shown = revisions.find((r) => r.number === number);
  const { preloads, opening } = number !== null ? await openingFetches(project.id, number) : { preloads: [], opening: null };
  return (
    <div className="flex flex-col gap-3">
      {preloads.map((href) => (
        <link key={href} rel="preload" href={href} as="fetch" crossOrigin="anonymous" />
      ))}
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
          <LiveReview key={number} projectId={project.id} revisionNumber={number} openingResultId={opening} realtimeUrl={realtimeUrl()} focusClash={typeof clash === "string" ? clash : null} />
        </>
      )}
    </div>
  );
}
