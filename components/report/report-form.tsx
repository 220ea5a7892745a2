// The report page's forms: the PDF report is made by a job (ReportPdfForm follows it); the exports are plain GET
// forms to their route handlers, so the browser downloads the CSV or IFC itself; the revision picker reloads the
// page for the revision chosen.
import { ReportPdfForm, type ResultOption } from "@/components/report/report-pdf-form";
import { RevisionPicker } from "@/components/revision/revision-picker";
import type { RevisionOption } from "@/components/revision/revision-select";
import type { ReportJobView } from "@/db/queries/jobs";

const selectClass = "rounded-md border border-board-200 bg-white px-3 py-2 text-sm";
const buttonClass = "inline-flex items-center justify-center rounded-md bg-board-800 px-4 py-2 text-sm font-medium text-white hover:bg-board-900";

/** One <option> per result, "id: name". */
function ResultOptions({ results }: { results: ResultOption[] }) {
  return results.map((r) => (
    <option key={r.id} value={r.id}>
      {r.id}: {r.name}
    </option>
  ));
}

export function ReportForm({
  projectId,
  revisions,
  revision,
  results,
  defaultChosen,
  canMake,
  recent,
}: {
  projectId: string;
  revisions: RevisionOption[];
  revision: number;
  results: ResultOption[];
  defaultChosen: string[];
  /** The rule book's report.make for this member. */
  canMake: boolean;
  recent: ReportJobView[];
}) {
  const api = `/api/projects/${projectId}`;
  return (
    <div className="flex flex-col gap-6">
      {/* Choosing a revision reloads the page for it, so the report and exports below always use the revision picked. */}
      <div data-testid="report-revision-form">
        <RevisionPicker projectId={projectId} page="report" revisions={revisions} current={revision} testId="report-revision" />
      </div>

      <ReportPdfForm projectId={projectId} revision={revision} results={results} defaultChosen={defaultChosen} canMake={canMake} recent={recent} />

      <div className="flex flex-col gap-3 rounded-lg border border-board-200 bg-white p-4">
        <h3 className="text-sm font-medium text-board-800">CSV exports</h3>
        <form method="get" action={`${api}/exports/member-forces.csv`} className="flex flex-wrap items-end gap-3">
          <input type="hidden" name="revision" value={revision} />
          <label className="flex flex-col gap-1 text-sm">
            Member forces of
            <select name="result" className={selectClass} defaultValue={defaultChosen[0]} data-testid="export-result">
              <ResultOptions results={results} />
            </select>
          </label>
          <button type="submit" className={buttonClass} data-testid="export-member-forces">
            Download member forces
          </button>
        </form>
        <form method="get" action={`${api}/exports/node-results.csv`} className="flex flex-wrap items-end gap-3">
          <input type="hidden" name="revision" value={revision} />
          <label className="flex flex-col gap-1 text-sm">
            Deflections and support reactions of
            <select name="result" className={selectClass} defaultValue={defaultChosen[0]} data-testid="export-node-result">
              <ResultOptions results={results} />
            </select>
          </label>
          <button type="submit" className={buttonClass} data-testid="export-node-results">
            Download node results
          </button>
        </form>
        <a className="text-sm text-tension underline" href={`${api}/exports/envelope.csv?revision=${revision}`} data-testid="export-envelope">
          Download the envelope (largest tension and compression per member)
        </a>
        <a className="text-sm text-tension underline" href={`${api}/exports/clashes.csv?revision=${revision}`} data-testid="export-clashes">
          Download the clashes (outcome, who proposed and decided, conditions or reason, assignee and due date)
        </a>
      </div>

      <div className="flex flex-col gap-3 rounded-lg border border-board-200 bg-white p-4">
        <h3 className="text-sm font-medium text-board-800">IFC and BCF exports</h3>
        <form method="get" action={`${api}/exports/revision.ifc`} className="flex flex-wrap items-end gap-3">
          <input type="hidden" name="revision" value={revision} />
          <label className="flex flex-col gap-1 text-sm">
            Force state of
            <select name="result" className={selectClass} defaultValue={defaultChosen[0]} data-testid="export-ifc-result">
              <ResultOptions results={results} />
            </select>
          </label>
          <button type="submit" className={buttonClass} data-testid="export-ifc">
            Download the roof as IFC4
          </button>
        </form>
        <a className="text-sm text-tension underline" href={`${api}/exports/pins.bcf`} data-testid="export-bcf">
          Download every pin and thread as BCF 3.0
        </a>
      </div>
    </div>
  );
}
