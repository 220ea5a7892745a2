"use client";
// Overall stability of the roof for the shown result: the critical load factor αcr of the whole truss (linear
// buckling, stored with the review), the EN 1993-1-1 5.2.1(3) warning below 10, and the first mode drawn on request.
import type { ReviewOverview } from "@/db/queries/revision-view";
import { STANDING_CAUTION } from "@/lib/review/caution";
import { useViewerStore } from "./viewer-store";

const format = (alpha: number) => (alpha >= 1000 ? alpha.toExponential(2) : alpha.toPrecision(3));

export function StabilityPanel({ review, nodeIds }: { review: ReviewOverview | null | undefined; nodeIds: readonly string[] }) {
  const resultId = useViewerStore((s) => s.resultId);
  const mode = useViewerStore((s) => s.mode);
  if (!review) return null;
  const stability = review.stability;
  const entry = stability?.results.find((r) => r.result === resultId);
  const label = entry ? `Buckling mode of ${entry.result}` : "";
  const drawn = mode !== null && mode.label === label;
  let body;
  if (!stability) body = <p>{review.wholeRoofChecksLeftOut ?? "Not computed for this revision: its review was stored before the overall stability check existed."}</p>;
  else if (!entry) body = <p>Checked for the design results only ({stability.results.map((r) => r.result).join(", ") || "none"}); choose one of them.</p>;
  else if (entry.alphaCr === null) body = <p>{entry.converged ? "No load factor buckles the roof under this result: no member force can destabilise it." : entry.warning}</p>;
  else {
    body = (
      <>
        <p>
          Critical load factor <span className="font-mono" data-testid="stability-alpha">αcr = {format(entry.alphaCr)}</span>
          {entry.modes.length > 1 ? <span className="text-board-700"> (next modes {entry.modes.slice(1).map((m) => format(m.alphaCr)).join(", ")})</span> : null}
          {entry.alphaCr >= stability.limit && entry.converged ? <span> — at least {stability.limit}: first-order analysis is enough (EN 1993-1-1 5.2.1(3)).</span> : null}
        </p>
        {entry.warning ? (
          <p role="alert" className="font-semibold text-clash" data-testid="stability-warning">
            {entry.warning}
          </p>
        ) : null}
        {entry.shape ? (
          <button
            type="button"
            className="rounded border border-board-200 px-2 py-0.5 hover:bg-board-100"
            onClick={() => useViewerStore.getState().showMode(drawn ? null : { label, nodeIds, shape: entry.shape! })}
            data-testid="stability-draw-mode"
          >
            {drawn ? "Clear the mode" : "Draw the buckling mode"}
          </button>
        ) : null}
      </>
    );
  }
  // One row under the toolbar (issue 17 item 9: the canvas gets the height); the basis and the caution are a click
  // away in the same row rather than a paragraph above the roof.
  return (
    <section className="flex flex-wrap items-center gap-x-3 gap-y-1 border-b border-board-100 px-3 py-1.5 text-xs" data-testid="stability-panel" aria-label="Overall stability">
      <h2 className="font-semibold">Overall stability of the roof:</h2>
      {body}
      {drawn ? <p className="text-board-700">The mode is drawn with its largest motion a tenth of the span (the shape matters, not the size).</p> : null}
      {stability ? (
        <details className="text-board-700">
          <summary className="cursor-pointer">How it is computed</summary>
          <p className="mt-1">
            {stability.basis} {STANDING_CAUTION}
          </p>
        </details>
      ) : null}
    </section>
  );
}
