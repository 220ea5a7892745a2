// The report page's forms: plain GET forms to the report and export route handlers, so the browser downloads
// the PDF or CSV itself; the revision picker reloads the page for the revision chosen.
import { RevisionPicker } from "@/components/revision/revision-picker";
import type { RevisionOption } from "@/components/revision/revision-select";

type ResultOption = { id: string; name: string; kind: "combination" | "load case" };

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
}: {
  projectId: string;
  revisions: RevisionOption[];
  revision: number;
  results: ResultOption[];
  defaultChosen: string[];
}) {
  const api = `/api/projects/${projectId}`;
  return (
    <div className="flex flex-col gap-6">
      {/* Choosing a revision reloads the page for it, so the PDF and exports below always use the revision picked. */}
      <div data-testid="report-revision-form">
        <RevisionPicker projectId={projectId} page="report" revisions={revisions} current={revision} testId="report-revision" />
      </div>

      <form method="get" action={`${api}/report`} target="_blank" className="flex flex-col gap-4 rounded-lg border border-board-200 bg-white p-4" data-testid="report-form">
        <input type="hidden" name="revision" value={revision} />
        <fieldset className="flex flex-col gap-2">
          <legend className="mb-1 text-sm font-medium text-board-800">Results to tabulate</legend>
          {results.map((r) => (
            <label key={r.id} className="flex items-center gap-2 text-sm">
              <input type="checkbox" name="combinations" value={r.id} defaultChecked={defaultChosen.includes(r.id)} />
              <span className="font-mono text-xs">{r.id}</span> {r.name} <span className="text-board-700">({r.kind})</span>
            </label>
          ))}
        </fieldset>
        <fieldset className="flex flex-wrap items-end gap-3">
          <legend className="mb-1 text-sm font-medium text-board-800">Compare member states between (optional)</legend>
          {["first", "second"].map((which) => (
            <label key={which} className="flex flex-col gap-1 text-sm">
              {which === "first" ? "First result" : "Second result"}
              <select name="compare" defaultValue="" className={selectClass} data-testid={`report-compare-${which}`}>
                <option value="">none</option>
                <ResultOptions results={results} />
              </select>
            </label>
          ))}
        </fieldset>
        <div>
          <button type="submit" className={buttonClass} data-testid="report-download">
            Make the PDF report
          </button>
        </div>
      </form>

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
