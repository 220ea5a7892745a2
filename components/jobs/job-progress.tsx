"use client";
// What the browser shows of a queued job (an analysis, hanging the services, a report): a progress bar with the phase while it runs, the
// reason and a retry button when it failed. Each change of the job is a live event ("job", its id) that refetches
// it (components/live/invalidation.ts); the slow poll only covers a live connection that is down.
import { useMutation, useQuery, useQueryClient } from "@tanstack/react-query";
import { useEffect } from "react";
import type { JobView } from "@/db/queries/jobs";
import { Button, FormMessage } from "@/components/ui/form";
import { apiFetch } from "@/lib/http/fetcher";

const PHASE_LABELS: Record<string, string> = {
  queued: "Waiting for the job runner",
  starting: "Starting",
  analysis: "Solving every load case and combination",
  review: "Reviewing members (checks, verdicts)",
  storing: "Storing the results",
  factorising: "Factorising the stiffness",
  "unit loads": "Solving a unit load at every top-layer node",
  done: "Analysed",
  failed: "Failed",
};
/** Where a report job's words differ from an analysis's. */
const REPORT_PHASE_LABELS: Record<string, string> = {
  collecting: "Reading the revision, its review, clashes and questions",
  drawing: "Drawing the pages",
  storing: "Storing the PDF",
  done: "Report ready",
};
/** Where hanging the services' words differ (its analysis then follows as a job of its own). */
const HANG_PHASE_LABELS: Record<string, string> = {
  queued: "Waiting for the job runner to hang the services",
  hanging: "Hanging the services from the bottom layer",
  clashes: "Detecting the clashes on the new revision",
  storing: "Storing the new revision and queueing its analysis",
  done: "Services hung",
};
const KIND_PHASE_LABELS: Partial<Record<JobView["kind"], Record<string, string>>> = { report: REPORT_PHASE_LABELS, hang_services: HANG_PHASE_LABELS };
const phaseLabel = (job: JobView) => KIND_PHASE_LABELS[job.kind]?.[job.phase] ?? PHASE_LABELS[job.phase] ?? job.phase;
const RETRY_LABELS: Record<JobView["kind"], string> = { analysis: "Retry the analysis", any_load: "Retry the check", report: "Retry the report", hang_services: "Retry hanging the services" };

export const jobKey = (projectId: string, jobId: string) => ["projects", projectId, "jobs", jobId] as const;
const isActive = (job: JobView | undefined) => job?.state === "queued" || job?.state === "running";
const POLL_WITHOUT_LIVE_MS = 5_000;

/** Follows a job until it is done or failed; `onSettled` runs once when it gets there. */
export function useJob(projectId: string, initial: JobView, onSettled?: (job: JobView) => void) {
  const query = useQuery({
    queryKey: jobKey(projectId, initial.id),
    queryFn: async () => (await apiFetch<{ job: JobView }>(`/api/projects/${projectId}/jobs/${initial.id}`)).job,
    initialData: initial,
    refetchInterval: (q) => (isActive(q.state.data) ? POLL_WITHOUT_LIVE_MS : false),
  });
  const job = query.data;
  useEffect(() => {
    if (!isActive(job)) onSettled?.(job);
    // Only the state change matters; onSettled is a fresh closure each render.
    // eslint-disable-next-line react-hooks/exhaustive-deps
  }, [job.state]);
  return job;
}

/** The job's progress bar, or its failure with a retry button for those who may start that kind of job. */
export function JobProgress({ projectId, job, canRetry }: { projectId: string; job: JobView; canRetry: boolean }) {
  const queryClient = useQueryClient();
  const retry = useMutation({
    mutationFn: () => apiFetch<{ job: JobView }>(`/api/projects/${projectId}/jobs/${job.id}/retry`, { method: "POST" }),
    onSuccess: ({ job: queued }) => queryClient.setQueryData(jobKey(projectId, job.id), queued),
  });
  const label = phaseLabel(job);
  if (job.state === "failed") {
    return (
      <div className="flex flex-col gap-1" data-testid="job-failed">
        <p role="alert" className="text-sm text-clash">
          {job.error ?? "The job failed."}
        </p>
        {canRetry ? (
          <Button type="button" variant="quiet" onClick={() => retry.mutate()} disabled={retry.isPending} data-testid="job-retry">
            {retry.isPending ? "Queuing again…" : RETRY_LABELS[job.kind]}
          </Button>
        ) : null}
        <FormMessage message={retry.error?.message} />
      </div>
    );
  }
  if (job.state === "done") return <span className="text-tension" data-testid="job-done">{label}</span>;
  return (
    <div className="flex min-w-40 flex-col gap-0.5" data-testid="job-progress">
      <progress className="h-2 w-full accent-tension" max={100} value={job.percent} aria-label={`${label}: ${job.percent} %`} />
      <span className="text-xs text-board-700" role="status">
        {label} · {job.percent} %
      </span>
    </div>
  );
}

/**
 * A step the browser itself waits on before there is a job to follow (uploading a file, generating a roof, hanging
 * the services): the phase, and the percent when it is known (an indeterminate bar otherwise).
 */
export function StepProgress({ phase, percent }: { phase: string; percent?: number }) {
  return (
    <div className="flex min-w-40 flex-col gap-0.5" data-testid="step-progress">
      <progress className="h-2 w-full accent-tension" max={100} value={percent} aria-label={percent === undefined ? phase : `${phase}: ${percent} %`} />
      <span className="text-xs text-board-700" role="status">
        {phase}
        {percent === undefined ? "…" : ` · ${percent} %`}
      </span>
    </div>
  );
}

/** Brings what a finished job produced into view (the revision row, the report file, the hanging's result). */
export function scrollIntoViewWhenDone(job: JobView, selector: string): void {
  if (job.state === "done") document.querySelector(selector)?.scrollIntoView({ block: "center", behavior: "smooth" });
}

/** A job followed live: progress while it runs, then `onSettled` (e.g. refetch what it produced). */
export function LiveJob({ projectId, job, canRetry, onSettled }: { projectId: string; job: JobView; canRetry: boolean; onSettled?: (job: JobView) => void }) {
  const current = useJob(projectId, job, onSettled);
  return <JobProgress projectId={projectId} job={current} canRetry={canRetry} />;
}
