"use client";

import { useMutation, useQuery, useQueryClient } from "@tanstack/react-query";
import { useEffect, useRef } from "react";
import Link from "next/link";
import type { RevisionSummary } from "@/db/queries/models";
import { LiveJob } from "@/components/jobs/job-progress";
import { RevisionStageBadge } from "@/components/revision/revision-stage-badge";
import { apiFetch } from "@/lib/http/fetcher";

export const revisionsKey = (projectId: string) => ["projects", projectId, "models"] as const;

/**
 * The project's revisions, newest first, each opening in the viewer and labelled current, draft or unstable; an
 * analysis still running shows its progress; the structural engineer marks which one is current.
 */
export function RevisionList({ projectId, canRetry, canMarkCurrent }: { projectId: string; canRetry: boolean; canMarkCurrent: boolean }) {
  const queryClient = useQueryClient();
  const markCurrent = useMutation({
    mutationFn: (number: number) => apiFetch(`/api/projects/${projectId}/models/${number}/current`, { method: "PUT" }),
    onSettled: () => void queryClient.invalidateQueries({ queryKey: revisionsKey(projectId) }),
  });
  const query = useQuery({
    queryKey: revisionsKey(projectId),
    queryFn: () => apiFetch<{ revisions: RevisionSummary[] }>(`/api/projects/${projectId}/models`),
  });
  // A revision seen waiting for its analysis is scrolled into view once the list shows it analysed (issue 17 item
  // 12). Read from the list, not from the job's own end: the stored analysis's live event may refetch the list
  // first, and the row's job view is then gone before it hears "done".
  const waiting = useRef(new Set<number>());
  useEffect(() => {
    for (const r of query.data?.revisions ?? []) {
      const analysed = r.analysisStatus === "ok" || r.analysisStatus === "unstable";
      if (!analysed && r.job) waiting.current.add(r.number);
      else if (analysed && waiting.current.delete(r.number)) document.querySelector(`[data-testid="revision-${r.number}"]`)?.scrollIntoView({ block: "center", behavior: "smooth" });
    }
  }, [query.data]);
  if (query.isPending) return <p className="text-sm text-board-700">Loading revisions…</p>;
  if (query.isError) return <p role="alert" className="text-sm text-clash">{query.error.message}</p>;
  const revisions = query.data.revisions;
  const markError = markCurrent.error ? <p role="alert" className="text-sm text-clash">{markCurrent.error.message}</p> : null;
  if (revisions.length === 0) return <p className="text-sm text-board-700" data-testid="revisions-empty">No model yet. A structural engineer can generate or upload one.</p>;
  return (
    <>
    {markError}
    {/* A phone scrolls the table sideways rather than the page (issue 17 item 11). */}
    <div className="overflow-x-auto">
    <table className="w-full text-sm" data-testid="revision-list">
      <thead className="text-left text-xs uppercase text-board-700">
        <tr>
          <th className="py-1">Rev.</th>
          <th>Name</th>
          <th>Source</th>
          <th>Members</th>
          <th>Stage</th>
          <th>Analysis</th>
          <th>Saved</th>
          <th />
        </tr>
      </thead>
      <tbody>
        {revisions.map((r, k) => (
          <tr key={r.id} className="border-t border-board-100" data-testid={`revision-${r.number}`}>
            <td className="py-1 font-mono">{r.number}</td>
            <td>{r.name}</td>
            <td>{r.source}</td>
            <td className="font-mono">{r.memberCount}</td>
            <td>
              <RevisionStageBadge revision={r} />
              {canMarkCurrent && !r.isCurrent && r.analysisStatus === "ok" && (
                <button type="button" className="ml-2 text-xs underline" disabled={markCurrent.isPending} onClick={() => markCurrent.mutate(r.number)} data-testid="revision-mark-current">
                  Mark current
                </button>
              )}
            </td>
            <td className={r.analysisStatus === "unstable" ? "font-medium text-compression" : "text-board-800"} data-testid="revision-analysis">
              {r.analysisStatus === "ok" ? (
                "analysed"
              ) : r.analysisStatus === "unstable" ? (
                "unstable"
              ) : r.job ? (
                <LiveJob
                  projectId={projectId}
                  job={r.job}
                  canRetry={canRetry}
                  onSettled={() => void queryClient.invalidateQueries({ queryKey: revisionsKey(projectId) })}
                />
              ) : (
                "not analysed"
              )}
            </td>
            <td className="text-xs">
              {new Date(r.createdAt).toLocaleString()} {r.createdBy ? `by ${r.createdBy}` : ""}
            </td>
            <td>
              <Link className="text-tension underline" href={`/projects/${projectId}/viewer?revision=${r.number}`}>
                Open in 3D
              </Link>
              {k + 1 < revisions.length && (
                <Link className="ml-3 underline" href={`/projects/${projectId}/models/compare?from=${revisions[k + 1].number}&to=${r.number}`} data-testid="revision-compare">
                  Compare with {revisions[k + 1].number}
                </Link>
              )}
              {r.originals.map((file) => (
                // The attachments route redirects to a short-lived download URL of the object store.
                <a key={file.id} className="ml-3 text-xs text-board-700 underline" href={`/api/projects/${projectId}/attachments/${file.id}`} data-testid="revision-original">
                  {file.filename}
                </a>
              ))}
            </td>
          </tr>
        ))}
      </tbody>
    </table>
    </div>
    </>
  );
}
