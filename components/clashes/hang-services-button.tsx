"use client";
// "Hang the services" (structural engineer): the runs' weight becomes the hung-services load case of a new
// revision. Two chained jobs do the work (hanging with clash detection, then the new revision's analysis); one
// progress bar follows the first, then the second, and the result shows which zero-force members start carrying
// load, scrolled into view when the analysis is done.
import { useMutation } from "@tanstack/react-query";
import Link from "next/link";
import { useState } from "react";
import { Button, FormMessage } from "@/components/ui/form";
import type { JobView } from "@/db/queries/jobs";
import { JobProgress, scrollIntoViewWhenDone, StepProgress, useJob } from "@/components/jobs/job-progress";
import type { HangServicesOutcome } from "@/lib/commands/store-hung-services";
import { apiFetch } from "@/lib/http/fetcher";
import { STANDING_CAUTION } from "@/lib/review/caution";

const RESULT = '[data-testid="hang-services-result"]';

/** What the analysis job of the new revision found (see server/jobs/analysis.ts). */
type AnalysisOutcome = { status: "ok" | "unstable"; zeroForce: { noLongerZero: string[]; newlyZero: string[] } | null };

function ZeroForceChange({ job }: { job: JobView }) {
  const outcome = job.outcome as AnalysisOutcome | null;
  if (job.state !== "done" || !outcome) return null;
  if (outcome.status !== "ok") return <>The new revision is unstable. </>;
  return outcome.zeroForce ? (
    <>
      {outcome.zeroForce.noLongerZero.length} member(s) zero in all combinations before now carry force; {outcome.zeroForce.newlyZero.length} became zero.{" "}
    </>
  ) : null;
}

export function HangServicesButton({ projectId, revision }: { projectId: string; revision: number }) {
  const [spacing, setSpacing] = useState("2.5");
  const hang = useMutation({
    mutationFn: () => apiFetch<{ job: JobView }>(`/api/projects/${projectId}/services`, { method: "POST", body: { revision, hangerSpacing: Number(spacing) } }),
  });
  return (
    <div className="flex flex-col gap-2" data-testid="hang-services">
      <div className="flex flex-wrap items-end gap-2">
        <label className="flex flex-col text-sm font-medium text-board-800">
          Hanger spacing (m)
          <input type="number" min={0.5} max={12} step={0.5} value={spacing} onChange={(e) => setSpacing(e.target.value)} className="mt-1 w-24 rounded-md border border-board-200 px-2 py-1.5 font-normal" />
        </label>
        <Button type="button" onClick={() => hang.mutate()} disabled={hang.isPending} data-testid="hang-services-submit">
          {hang.isPending ? "Queueing…" : "Hang the services"}
        </Button>
      </div>
      <FormMessage message={hang.error?.message} />
      {hang.isPending ? <StepProgress phase="Queueing the hanging of the services" /> : null}
      {/* keyed by the job: a second hanging starts a fresh view rather than reusing the first one's */}
      {hang.data && <HangResult key={hang.data.job.id} projectId={projectId} hangJob={hang.data.job} />}
    </div>
  );
}

/** The hanging's job, then (once it has stored the new revision) that revision's analysis job, in one box. */
function HangResult({ projectId, hangJob }: { projectId: string; hangJob: JobView }) {
  const job = useJob(projectId, hangJob);
  const outcome = job.state === "done" ? (job.outcome as HangServicesOutcome | null) : null;
  return (
    <div className="flex flex-col gap-1 rounded-md border border-tension/30 bg-tension/5 p-2 text-sm" role="status" data-testid="hang-services-result">
      {outcome ? <HungRevision projectId={projectId} outcome={outcome} /> : <JobProgress projectId={projectId} job={job} canRetry />}
    </div>
  );
}

function HungRevision({ projectId, outcome }: { projectId: string; outcome: HangServicesOutcome }) {
  const analysis = useJob(projectId, outcome.analysisJob, (settled) => scrollIntoViewWhenDone(settled, RESULT));
  const number = outcome.revision.number;
  return (
    <>
      <p>
        Revision {number} created: {outcome.totalLoad.toFixed(2)} kN on {outcome.hangers} hangers, {outcome.detection.found} clash(es). <ZeroForceChange job={analysis} />
        <Link className="text-tension underline" href={`/projects/${projectId}/clashes?revision=${number}`}>
          Open its clashes
        </Link>{" "}
        ·{" "}
        <Link className="text-tension underline" href={`/projects/${projectId}/viewer?revision=${number}`}>
          View it in 3D
        </Link>
      </p>
      {analysis.state === "done" ? null : <JobProgress projectId={projectId} job={analysis} canRetry />}
      {/* Which members became (or stopped being) zero invites removing or cutting them: the caution goes with it. */}
      <p className="text-board-700" data-testid="hang-services-caution">
        {STANDING_CAUTION}
      </p>
    </>
  );
}
