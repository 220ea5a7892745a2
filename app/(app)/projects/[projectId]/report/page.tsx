import type { Metadata } from "next";
import { LiveInvalidation } from "@/components/live/live-invalidation";
import { ReportForm } from "@/components/report/report-form";
import { RevisionStageBadge } from "@/components/revision/revision-stage-badge";
import { listReportJobs } from "@/db/queries/jobs";
import { getRevisionWithResults, listRevisionsByProject } from "@/db/queries/models";
import { requirePageProject } from "@/lib/auth/page";
import { defaultRevision } from "@/lib/models/revision-stage";
import { capturedMailPageEnabled } from "@/lib/mail/captured";
import { realtimeUrl } from "@/lib/realtime/browser-url";
import { REPORT_RESULTS_MAX } from "@/lib/report/schemas";
import { STANDING_CAUTION } from "@/lib/review/caution";

export const metadata: Metadata = { title: "Report" };

export default async function ReportPage({ params, searchParams }: PageProps<"/projects/[projectId]/report">) {
  const { projectId } = await params;
  const { project } = await requirePageProject(projectId, "report.export");
  const revisions = await listRevisionsByProject({ projectId });
  const asked = Number((await searchParams).revision);
  const chosen = revisions.find((r) => r.number === asked) ?? defaultRevision(revisions);
  const revision = chosen ? await getRevisionWithResults({ projectId, number: chosen.number }) : null;
  const recent = revision ? await listReportJobs({ projectId, revision: revision.number }) : [];
  const results = revision
    ? [
        ...revision.model.combinations.map((c) => ({ id: c.id, name: c.name, kind: "combination" as const })),
        ...revision.model.loadCases.map((c) => ({ id: c.id, name: c.name, kind: "load case" as const })),
      ]
    : [];
  return (
    <div className="flex flex-col gap-6">
      <LiveInvalidation projectId={project.id} realtimeUrl={realtimeUrl()} />
      <section className="flex max-w-3xl flex-col gap-4" data-testid="report-page">
        <h2 className="flex items-center gap-2 text-lg font-semibold">
          Review report and exports {chosen ? <RevisionStageBadge revision={chosen} /> : null}
        </h2>
        <p className="text-sm text-board-700">
          A PDF of the chosen revision, made in the background: its identity (who made it current, the hash of the stored model),
          model summary, load cases and combinations; per result a plan coloured by force state, support reactions with the
          balance check, member forces and zero-force members; the most utilised members per check with their arithmetic; the
          members whose state differs between two results; every clash with a plan snippet and its decision history; the record of the proposals and decisions in each thread; the open questions.
        </p>
        <p className="rounded-md border border-compression/40 bg-compression/5 px-3 py-2 text-sm text-board-800">{STANDING_CAUTION}</p>
        {!revision ? (
          <p className="text-board-700" data-testid="report-empty">
            This project has no model revision yet. Add one on the Models page first.
          </p>
        ) : !revision.analysis || revision.analysis.status !== "ok" ? (
          <p className="text-board-700" data-testid="report-unanalysed">
            Revision {revision.number} has no stable analysis, so there are no forces to report.
          </p>
        ) : (
          <ReportForm
            projectId={project.id}
            revisions={revisions.map(({ number, name, isCurrent, analysisStatus }) => ({ number, name, isCurrent, analysisStatus }))}
            revision={revision.number}
            results={results}
            defaultChosen={(revision.model.combinations.length ? revision.model.combinations : revision.model.loadCases).slice(0, REPORT_RESULTS_MAX).map((c) => c.id)}
            canMake={project.abilities["report.make"]}
            recent={recent}
          />
        )}
        {project.abilities["mail.viewCaptured"] && capturedMailPageEnabled() ? (
          <p className="text-sm text-board-700">
            Development: <a className="underline" href={`/projects/${project.id}/mail`}>mail captured by the local SMTP server</a>.
          </p>
        ) : null}
      </section>
    </div>
  );
}
