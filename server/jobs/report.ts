// The report job: reads what the report shows, draws the PDF (progress per part) and stores it with the job marked
// done, in one transaction (lib/commands/store-report.ts). Progress goes to the jobs row the browser polls. A
// failure stores nothing and leaves the job failed with its reason, until someone retries it.
import { claimJob, failJob, setJobProgress } from "../../db/queries/jobs";
import { storeReport } from "../../lib/commands/store-report";
import { buildReportPdf, type ReportProgress } from "../../lib/report/pdf";
import { readStoredJobInput } from "../../lib/jobs/stored-input";
import { reportJobInputSchema } from "../../lib/report/schemas";
import type { ReportInput } from "../../lib/report/types";
import { collectReport } from "./report-data";

/** What the job draws with; tests pass a failing build to check that nothing half-stored remains. */
export type ReportSteps = { build: (input: ReportInput, onProgress: ReportProgress) => Promise<{ pdf: Buffer; pages: number }> };
const defaultSteps: ReportSteps = { build: buildReportPdf };

/** Works one report job; returns its final state ("skipped" when it was already done, failed or removed). */
export async function runReportJob(jobId: string, steps: ReportSteps = defaultSteps, now = () => new Date()): Promise<"done" | "failed" | "skipped"> {
  const job = await claimJob({ jobId });
  if (!job || job.kind !== "report") return "skipped";
  try {
    if (!job.requestedBy) throw new Error("the member who asked for it has left the project's users; ask for a new report.");
    const query = readStoredJobInput(reportJobInputSchema, job.input, "ask for a new report on the report page.");
    await setJobProgress({ jobId, phase: "collecting", percent: 5 });
    const input = await collectReport({ projectId: job.projectId, revisionId: job.revisionId, requestedBy: job.requestedBy }, query, now());
    // Drawing is 10 % to 90 %; progress rows are written at most every 5 %, so a long report is not a write storm.
    let written = 10;
    await setJobProgress({ jobId, phase: "drawing", percent: written });
    const { pdf, pages } = await steps.build(input, async (fraction) => {
      const percent = 10 + Math.floor(80 * fraction);
      if (percent >= written + 5) {
        written = percent;
        await setJobProgress({ jobId, phase: "drawing", percent });
      }
    });
    await setJobProgress({ jobId, phase: "storing", percent: 95 });
    const filename = `strutroom-review-rev${input.revision.number}.pdf`;
    const stored = await storeReport({ job: { id: job.id, projectId: job.projectId, revisionId: job.revisionId, revisionNumber: input.revision.number, requestedBy: job.requestedBy }, filename, pdf, pages });
    return stored ? "done" : "skipped";
  } catch (error) {
    const reason = error instanceof Error ? error.message : String(error);
    await failJob({ jobId, error: `The report stopped: ${reason}` });
    return "failed";
  }
}
