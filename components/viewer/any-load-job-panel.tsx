"use client";
// "Idle for any roof load" for the whole roof, started from the viewer when the stored review left it out (roofs
// past the whole-roof check limit): a button for those the rule book lets run analyses, then the job's progress
// (phase and percent, retry on failure); when it is stored the revision is fetched again and the member panel
// shows each member's answer.
import { useMutation } from "@tanstack/react-query";
import { useState } from "react";
import type { JobView } from "@/db/queries/jobs";
import { LiveJob } from "@/components/jobs/job-progress";
import { Button, FormMessage } from "@/components/ui/form";
import { apiFetch } from "@/lib/http/fetcher";
import type { ViewedRevision } from "./viewed-revision";

export function AnyLoadJobPanel({ projectId, revision, onStored }: { projectId: string; revision: ViewedRevision; onStored: () => void }) {
  const [started, setStarted] = useState<JobView | null>(null);
  const start = useMutation({
    mutationFn: () => apiFetch<{ job: JobView }>(`/api/projects/${projectId}/models/${revision.number}/any-load`, { method: "POST" }),
    onSuccess: ({ job }) => setStarted(job),
  });
  const review = revision.analysis?.review;
  if (!review || review.anyLoad) return null;
  const job = started ?? revision.anyLoadJob;
  const canRun = revision.abilities.runAnalysis;
  return (
    <section className="border-b border-board-100 px-3 py-2 text-xs" data-testid="any-load-job-panel" aria-label="Idle for any roof load">
      <h2 className="font-semibold">Idle for any roof load</h2>
      <p className="text-board-700">
        Not yet checked for this roof: one solve per 1 kN load along x, y and z at every top-layer node, so each member is known to work, or not, under any roof
        load.
      </p>
      {job && job.state !== "done" ? (
        <LiveJob key={job.id} projectId={projectId} job={job} canRetry={canRun} onSettled={(settled) => settled.state === "done" && onStored()} />
      ) : canRun ? (
        <Button type="button" variant="quiet" onClick={() => start.mutate()} disabled={start.isPending} data-testid="any-load-start">
          {start.isPending ? "Queuing…" : "Check the whole roof (runs as a job)"}
        </Button>
      ) : (
        <p>A structural engineer of the project can start it.</p>
      )}
      <FormMessage message={start.error?.message} />
    </section>
  );
}
