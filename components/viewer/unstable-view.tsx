"use client";
// The viewer of an unstable revision: no forces to colour, so the roof is drawn as it would move. Each mechanism
// mode of the stored analysis (lib/analysis/mechanism.ts) is listed with every moving joint and its direction, and
// drawn on the roof on request (the first when the page opens), with the standing caution.
import type { ReactNode } from "react";
import { describeDirection, type MechanismMode } from "@/lib/analysis/mechanism";
import { STANDING_CAUTION } from "@/lib/review/caution";
import { useViewerStore } from "./viewer-store";
import type { InfoOverview } from "@/db/queries/revision-view";

/** The label a drawn mechanism mode of the revision goes by (the viewer store's mode label). */
export const mechanismLabel = (k: number) => `Mechanism ${k + 1} of this revision`;

/** Draws mode k of an unstable revision on the roof (its shape is in the model's node order). */
export function drawMechanism(k: number, mode: MechanismMode, nodeIds: readonly string[]) {
  useViewerStore.getState().showMode({ label: mechanismLabel(k), nodeIds, shape: mode.shape });
}

const JOINTS_LISTED = 24;

export function UnstableView({ info, nodeIds, children }: { info: InfoOverview | undefined; nodeIds: readonly string[]; children: ReactNode }) {
  const shown = useViewerStore((s) => s.mode?.label ?? null);
  const modes = info?.mechanismModes ?? [];
  return (
    <div className="flex flex-col" data-testid="viewer-unstable">
      <div className="p-4" role="alert">
        <p className="font-semibold">This revision has no results to show: the structure is unstable (a mechanism).</p>
        {modes.length === 0 ? (
          <ul className="mt-2 list-disc pl-6 text-sm">
            {(info?.instabilityText ?? []).map((line) => (
              <li key={line}>{line}</li>
            ))}
          </ul>
        ) : null}
      </div>
      {modes.length > 0 ? (
        <div className="flex flex-col gap-2 px-4 pb-3 text-sm">
          {modes.map((mode, k) => {
            const drawn = shown === mechanismLabel(k);
            return (
              <section key={k} className="rounded border border-board-200 p-2" data-testid={`mechanism-${k + 1}`}>
                <p>{info?.instabilityText?.[k]}</p>
                <table className="mt-1 text-xs" data-testid={`mechanism-${k + 1}-joints`}>
                  <thead>
                    <tr className="text-left">
                      <th className="pr-4">Joint</th>
                      <th className="pr-4">Moves along</th>
                      <th>Share of the largest motion</th>
                    </tr>
                  </thead>
                  <tbody>
                    {mode.joints.slice(0, JOINTS_LISTED).map((joint) => (
                      <tr key={joint.node}>
                        <td className="pr-4 font-mono">{joint.node}</td>
                        <td className="pr-4">{describeDirection(joint.direction)}</td>
                        <td>{(100 * joint.share).toFixed(0)} %</td>
                      </tr>
                    ))}
                  </tbody>
                </table>
                {mode.joints.length > JOINTS_LISTED ? <p className="text-xs text-board-700">and {mode.joints.length - JOINTS_LISTED} more joints</p> : null}
                <button
                  type="button"
                  className="mt-1 rounded border border-board-200 px-2 py-1 text-xs hover:bg-board-100"
                  onClick={() => (drawn ? useViewerStore.getState().showMode(null) : drawMechanism(k, mode, nodeIds))}
                  data-testid={`unstable-draw-mechanism-${k + 1}`}
                >
                  {drawn ? `Clear mechanism ${k + 1}` : `Draw mechanism ${k + 1}`}
                </button>
              </section>
            );
          })}
          <p className="text-xs text-board-700">
            A drawn mode shows how the joints would move with nothing resisting, its largest motion a tenth of the span (the shape matters, not the size). {STANDING_CAUTION}
          </p>
        </div>
      ) : null}
      <div className="relative h-[60vh]">{children}</div>
    </div>
  );
}
