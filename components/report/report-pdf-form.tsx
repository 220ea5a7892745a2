"use client";
// "Make the PDF report": the results and comparison chosen here are sent to the report route, which queues a job;
// the jobs process draws and stores the PDF while this form shows its progress (phase and percent), then a link
// to the stored file. A failed report shows why and can be retried. Viewers download the reports others made; the
// list follows every report stored by anyone on the team (useRevisionReports) without a reload.
import { useMutation } from "@tanstack/react-query";
import { useState } from "react";
import { JobProgress, useJob } from "@/components/jobs/job-progress";
import { Button, FormMessage } from "@/components/ui/form";
import type { JobView, ReportJobView } from "@/db/queries/jobs";
import { apiFetch, type ApiError } from "@/lib/http/fetcher";
import type { ReportRequest } from "@/lib/report/schemas";
import { ResultOptions, selectClass, type ResultOption } from "./result-options";
import { useRevisionReports } from "./use-revision-reports";

type ReportOutcome = { attachmentId: string; filename: string; bytes: number; pages: number };

/** What the report page hands the PDF form (and, with the revisions, the whole report form). */
export type ReportPdfFormProps = {
  projectId: string;
  revision: number;
  results: ResultOption[];
  /** The results ticked at first: every combination (else every load case), at most a report's worth. */
  defaultChosen: string[];
  /** The rule book's report.make for this member. */
  canMake: boolean;
  /** The newest finished reports of the revision when the page was rendered. */
  recent: ReportJobView[];
};

function fileLink(projectId: string, outcome: ReportOutcome) {
  return `/api/projects/${projectId}/attachments/${outcome.attachmentId}`;
}

function ReportDownload({ projectId, job, testId }: { projectId: string; job: JobView; testId: string }) {
  const outcome = job.outcome as ReportOutcome | null;
  if (job.state !== "done" || !outcome) return null;
  return (
    <a className="text-sm font-medium text-tension underline" href={fileLink(projectId, outcome)} data-testid={testId}>
      Download {outcome.filename} ({outcome.pages} pages, {(outcome.bytes / 1024).toFixed(0)} kB)
    </a>
  );
}

/** The job just asked for: progress, then the download (scrolled into view when it is ready). */
function MadeReport({ projectId, job: initial, canRetry }: { projectId: string; job: JobView; canRetry: boolean }) {
  const job = useJob(projectId, initial, (settled) => {
    if (settled.state === "done") document.querySelector('[data-testid="report-file"]')?.scrollIntoView({ block: "nearest" });
  });
  return (
    <div className="flex flex-col gap-2 rounded-md border border-board-200 bg-board-50 p-3" data-testid="report-job" aria-live="polite">
      {job.state === "done" ? <ReportDownload projectId={projectId} job={job} testId="report-file" /> : <JobProgress projectId={projectId} job={job} canRetry={canRetry} />}
    </div>
  );
}

export function ReportPdfForm({ projectId, revision, results, defaultChosen, canMake, recent }: ReportPdfFormProps) {
  const reports = useRevisionReports(projectId, revision, recent);
  const [chosen, setChosen] = useState<string[]>(defaultChosen);
  const [compare, setCompare] = useState<[string, string]>(["", ""]);
  const make = useMutation<{ job: JobView }, ApiError, ReportRequest>({
    mutationFn: (body) => apiFetch(`/api/projects/${projectId}/report`, { method: "POST", body }),
  });
  const toggle = (id: string, on: boolean) => setChosen((list) => (on ? results.map((r) => r.id).filter((r) => r === id || list.includes(r)) : list.filter((r) => r !== id)));
  const submit = (event: React.FormEvent) => {
    event.preventDefault();
    const comparing = compare[0] && compare[1] ? compare : null;
    make.mutate({ revision, combinations: chosen, compare: comparing });
  };
  const issues = make.error?.issues ?? [];
  return (
    <div className="flex flex-col gap-4 rounded-lg border border-board-200 bg-white p-4">
      {canMake ? (
        <form onSubmit={submit} className="flex flex-col gap-4" data-testid="report-form">
          <fieldset className="flex flex-col gap-2">
            <legend className="mb-1 text-sm font-medium text-board-800">Results to draw and tabulate</legend>
            {results.map((r) => (
              <label key={r.id} className="flex items-center gap-2 text-sm">
                <input type="checkbox" name="combinations" value={r.id} checked={chosen.includes(r.id)} onChange={(e) => toggle(r.id, e.target.checked)} />
                <span className="font-mono text-xs">{r.id}</span> {r.name} <span className="text-board-700">({r.kind})</span>
              </label>
            ))}
            <FormMessage message={issues.find((i) => i.path === "combinations")?.message} />
          </fieldset>
          <fieldset className="flex flex-wrap items-end gap-3">
            <legend className="mb-1 text-sm font-medium text-board-800">Compare member states between (optional)</legend>
            {(["first", "second"] as const).map((which, k) => (
              <label key={which} className="flex flex-col gap-1 text-sm">
                {which === "first" ? "First result" : "Second result"}
                <select
                  name="compare"
                  value={compare[k]}
                  onChange={(e) => setCompare((pair) => (k === 0 ? [e.target.value, pair[1]] : [pair[0], e.target.value]))}
                  className={selectClass}
                  data-testid={`report-compare-${which}`}
                >
                  <option value="">none</option>
                  <ResultOptions results={results} />
                </select>
              </label>
            ))}
            <FormMessage message={issues.find((i) => i.path === "compare")?.message} />
          </fieldset>
          <div className="flex flex-wrap items-center gap-3">
            <Button type="submit" disabled={make.isPending || chosen.length === 0} data-testid="report-make">
              {make.isPending ? "Asking for the report…" : "Make the PDF report"}
            </Button>
            {chosen.length === 0 ? <span className="text-sm text-board-700">Choose at least one result.</span> : null}
          </div>
          <FormMessage message={issues.length ? undefined : make.error?.message} />
        </form>
      ) : (
        <p className="text-sm text-board-700" data-testid="report-viewer-note">
          Reports are made by the team members who review; as a viewer you download the reports they made, listed below.
        </p>
      )}
      {make.data ? <MadeReport key={make.data.job.id} projectId={projectId} job={make.data.job} canRetry={canMake} /> : null}
      <div className="flex flex-col gap-1" data-testid="report-recent">
        <h3 className="text-sm font-medium text-board-800">Reports of this revision</h3>
        {reports.length === 0 ? (
          <p className="text-sm text-board-700">None made yet.</p>
        ) : (
          <ul className="flex flex-col gap-1 text-sm">
            {reports.map((job) => (
              <li key={job.id} className="flex flex-wrap items-baseline gap-2">
                <ReportDownload projectId={projectId} job={job} testId="report-recent-file" />
                <span className="text-board-700">
                  made {job.createdAt.slice(0, 16).replace("T", " ")} UTC{job.requestedBy ? ` for ${job.requestedBy}` : ""}
                </span>
              </li>
            ))}
          </ul>
        )}
      </div>
    </div>
  );
}
