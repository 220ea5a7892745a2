"use client";
// "Hang the services" (structural engineer): the runs' weight becomes the hung-services load case of a new
// revision, analysed by a job, so the team sees which zero-force members start carrying load.
import { useMutation } from "@tanstack/react-query";
import Link from "next/link";
import { useState } from "react";
import { Button, FormMessage } from "@/components/ui/form";
import type { JobView } from "@/db/queries/jobs";
import { JobProgress, scrollIntoViewWhenDone, StepProgress, useJob } from "@/components/jobs/job-progress";
import { apiFetch } from "@/lib/http/fetcher";

interface HangAnswer {
  revision: { number: number };
  job: JobView;
  totalLoad: number;
  hangers: number;
  detection: { found: number };
}

/** What the analysis job of the new revision found (see server/jobs/analysis.ts). */
type HangOutcome = { status: "ok" | "unstable"; zeroForce: { noLongerZero: string[]; newlyZero: string[] } | null };

function ZeroForceChange({ job }: { job: JobView }) {
  const outcome = job.outcome as HangOutcome | null;
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
    mutationFn: () => apiFetch<HangAnswer>(`/api/projects/${projectId}/services`, { method: "POST", body: { revision, hangerSpacing: Number(spacing) } }),
  });
  const answer = hang.data;
  return (
    <div className="flex flex-col gap-2" data-testid="hang-services">
      <div className="flex flex-wrap items-end gap-2">
        <label className="flex flex-col text-sm font-medium text-board-800">
          Hanger spacing (m)
          <input type="number" min={0.5} max={12} step={0.5} value={spacing} onChange={(e) => setSpacing(e.target.value)} className="mt-1 w-24 rounded-md border border-board-200 px-2 py-1.5 font-normal" />
        </label>
        <Button type="button" onClick={() => hang.mutate()} disabled={hang.isPending} data-testid="hang-services-submit">
          {hang.isPending ? "Hanging…" : "Hang the services"}
        </Button>
      </div>
      <FormMessage message={hang.error?.message} />
      {hang.isPending ? <StepProgress phase="Hanging the services on the roof and saving the new revision" /> : null}
      {answer && <HangResult projectId={projectId} answer={answer} />}
    </div>
  );
}

function HangResult({ projectId, answer }: { projectId: string; answer: HangAnswer }) {
  const job = useJob(projectId, answer.job, (settled) => scrollIntoViewWhenDone(settled, '[data-testid="hang-services-done"]'));
  return (
    <div className="flex flex-col gap-1 rounded-md border border-tension/30 bg-tension/5 p-2 text-sm" role="status" data-testid="hang-services-done">
      <p>
        Revision {answer.revision.number} created: {answer.totalLoad.toFixed(2)} kN on {answer.hangers} hangers. <ZeroForceChange job={job} />
        <Link className="text-tension underline" href={`/projects/${projectId}/clashes?revision=${answer.revision.number}`}>
          Open its clashes
        </Link>{" "}
        ·{" "}
        <Link className="text-tension underline" href={`/projects/${projectId}/viewer?revision=${answer.revision.number}`}>
          View it in 3D
        </Link>
      </p>
      {job.state === "done" ? null : <JobProgress projectId={projectId} job={job} canRetry />}
    </div>
  );
}
