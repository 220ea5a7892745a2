// The report page's forms: the PDF report is made by a job (ReportPdfForm follows it); the exports are plain GET
// forms to their route handlers, so the browser downloads the CSV or IFC itself; the revision picker reloads the
// page for the revision chosen.
import { ReportPdfForm, type ReportPdfFormProps } from "@/components/report/report-pdf-form";
import { ResultOptions, selectClass, type ResultOption } from "@/components/report/result-options";
import { RevisionPicker } from "@/components/revision/revision-picker";
import type { RevisionOption } from "@/components/revision/revision-select";

const buttonClass = "inline-flex items-center justify-center rounded-md bg-board-800 px-4 py-2 text-sm font-medium text-white hover:bg-board-900";

/** A download of one result of the revision: a GET form to the export route, the result chosen in a select. */
function ResultExportForm({
  action,
  revision,
  results,
  defaultResult,
  label,
  button,
  testId,
}: {
  action: string;
  revision: number;
  results: ResultOption[];
  defaultResult: string | undefined;
  label: string;
  button: string;
  /** Test ids of the select and the button (the browser tests find them by these). */
  testId: { select: string; button: string };
}) {
  return (
    <form method="get" action={action} className="flex flex-wrap items-end gap-3">
      <input type="hidden" name="revision" value={revision} />
      <label className="flex flex-col gap-1 text-sm">
        {label}
        <select name="result" className={selectClass} defaultValue={defaultResult} data-testid={testId.select}>
          <ResultOptions results={results} />
        </select>
      </label>
      <button type="submit" className={buttonClass} data-testid={testId.button}>
        {button}
      </button>
    </form>
  );
}

export function ReportForm({ revisions, ...pdf }: ReportPdfFormProps & { revisions: RevisionOption[] }) {
  const { projectId, revision, results, defaultChosen } = pdf;
  const api = `/api/projects/${projectId}`;
  const exportOf = { revision, results, defaultResult: defaultChosen[0] };
  return (
    <div className="flex flex-col gap-6">
      {/* Choosing a revision reloads the page for it, so the report and exports below always use the revision picked. */}
      <div data-testid="report-revision-form">
        <RevisionPicker projectId={projectId} page="report" revisions={revisions} current={revision} testId="report-revision" />
      </div>

      <ReportPdfForm {...pdf} />

      <div className="flex flex-col gap-3 rounded-lg border border-board-200 bg-white p-4">
        <h3 className="text-sm font-medium text-board-800">CSV exports</h3>
        <ResultExportForm
          {...exportOf}
          action={`${api}/exports/member-forces.csv`}
          label="Member forces of"
          button="Download member forces"
          testId={{ select: "export-result", button: "export-member-forces" }}
        />
        <ResultExportForm
          {...exportOf}
          action={`${api}/exports/node-results.csv`}
          label="Deflections and support reactions of"
          button="Download node results"
          testId={{ select: "export-node-result", button: "export-node-results" }}
        />
        <a className="text-sm text-tension underline" href={`${api}/exports/envelope.csv?revision=${revision}`} data-testid="export-envelope">
          Download the envelope (largest tension and compression per member)
        </a>
        <a className="text-sm text-tension underline" href={`${api}/exports/clashes.csv?revision=${revision}`} data-testid="export-clashes">
          Download the clashes (outcome, who proposed and decided, conditions or reason, assignee and due date)
        </a>
      </div>

      <div className="flex flex-col gap-3 rounded-lg border border-board-200 bg-white p-4">
        <h3 className="text-sm font-medium text-board-800">IFC and BCF exports</h3>
        <ResultExportForm
          {...exportOf}
          action={`${api}/exports/revision.ifc`}
          label="Force state of"
          button="Download the roof as IFC4"
          testId={{ select: "export-ifc-result", button: "export-ifc" }}
        />
        <a className="text-sm text-tension underline" href={`${api}/exports/pins.bcf`} data-testid="export-bcf">
          Download every pin and thread as BCF 3.0
        </a>
      </div>
    </div>
  );
}
