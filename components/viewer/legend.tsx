"use client";
// The legend: always says what is shown (colouring and result) with the tension / compression / zero-force counts
// of the members drawn (the filters and the section box narrow them, and the legend says so); below it, the
// influence map's own legend while one is shown.
import { formatInfluence, influenceLegend } from "./influence-colours";
import { useViewerStore } from "./viewer-store";

const formatKn = (value: number) => `${value >= 0 ? "" : "−"}${Math.abs(value).toFixed(Math.abs(value) >= 100 ? 0 : 1)} kN`;

export function Legend() {
  const legend = useViewerStore((s) => s.legend);
  if (!legend) return null;
  const { counts, scale, members } = legend;
  return (
    <section data-testid="viewer-legend" aria-label="Legend" className="pointer-events-auto w-60 rounded-md border border-board-200 bg-white/90 p-2 text-xs shadow-sm">
      <p className="font-semibold text-board-900" data-testid="legend-title">{legend.title}</p>
      <p className="mb-2 text-xs text-board-700" data-testid="legend-result">{legend.resultLabel}</p>
      <ul className="space-y-1">
        {legend.entries.map((entry) => (
          <li key={entry.key} className="flex items-center gap-2" data-testid={`legend-entry-${entry.key}`}>
            <span aria-hidden className="inline-block h-3 w-5 rounded-sm border border-board-200" style={{ background: entry.colour }} />
            <span className="flex-1">{entry.label}</span>
            <span className="font-mono tabular-nums">{entry.count}</span>
          </li>
        ))}
      </ul>
      {legend.note ? (
        <p className="mt-2 text-xs text-board-700" data-testid="legend-note">
          {legend.note}
        </p>
      ) : null}
      {scale ? (
        <div className="mt-2">
          <div
            aria-hidden
            className="h-2 rounded-sm"
            style={{ background: `linear-gradient(to right, ${[scale.fromColour, scale.midColour, scale.toColour].filter(Boolean).join(", ")})` }}
          />
          <div className="mt-1 flex justify-between font-mono text-xs" data-testid="legend-scale">
            <span>{scale.unit === "kN" ? formatKn(scale.min) : scale.min}</span>
            {scale.midColour ? <span>0</span> : null}
            <span>{scale.unit === "kN" ? formatKn(scale.max) : scale.max}</span>
          </div>
        </div>
      ) : null}
      {members.counted < members.total ? (
        <p className="mt-2 text-xs text-board-700" data-testid="legend-filtered">
          Counting the {members.counted} of {members.total} members shown
        </p>
      ) : null}
      <dl className="mt-2 grid grid-cols-3 gap-1 border-t border-board-100 pt-2 text-center text-xs">
        <div>
          <dt className="text-tension">Tension</dt>
          <dd className="font-mono text-sm" data-testid="legend-count-tension">{counts.tension}</dd>
        </div>
        <div>
          <dt className="text-compression">Compression</dt>
          <dd className="font-mono text-sm" data-testid="legend-count-compression">{counts.compression}</dd>
        </div>
        <div>
          <dt className="text-board-700">Zero-force</dt>
          <dd className="font-mono text-sm" data-testid="legend-count-zero-force">{counts["zero-force"]}</dd>
        </div>
      </dl>
    </section>
  );
}

/** Legend of the influence map on screen (if any): what it shows, its range, and a way to clear it. */
export function InfluenceLegend() {
  const influence = useViewerStore((s) => s.influence);
  if (!influence) return null;
  const legend = influenceLegend(influence.member, influence.values);
  return (
    <section data-testid="influence-legend" aria-label="Influence map legend" className="pointer-events-auto mt-2 w-60 rounded-md border border-board-200 bg-white/90 p-2 text-xs shadow-sm">
      <p className="font-semibold text-board-900" data-testid="influence-legend-title">{legend.title}</p>
      <div aria-hidden className="mt-2 h-2 rounded-sm" style={{ background: `linear-gradient(to right, ${legend.fromColour}, ${legend.midColour}, ${legend.toColour})` }} />
      <div className="mt-1 flex justify-between font-mono text-xs">
        <span>{formatInfluence(-legend.scaleMax)}</span>
        <span>0</span>
        <span>{formatInfluence(legend.scaleMax)}</span>
      </div>
      <div className="flex justify-between text-xs text-board-700">
        <span>compression</span>
        <span>tension</span>
      </div>
      <p className="mt-1" data-testid="influence-legend-range">
        Range {formatInfluence(legend.min)} to {formatInfluence(legend.max)} {legend.unit} over {influence.values.length} top nodes
      </p>
      <button type="button" className="mt-2 rounded border border-board-200 px-2 py-0.5 hover:bg-board-100" onClick={() => useViewerStore.getState().showInfluence(null)} data-testid="influence-clear">
        Clear influence map
      </button>
    </section>
  );
}
