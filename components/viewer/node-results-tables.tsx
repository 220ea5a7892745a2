"use client";
// The per-result tables of node results the node and member panels share: displacements (mm) and support reactions
// (kN) in every load case and combination, the chosen result highlighted; a click on a result chooses it.
import type { NodeResult } from "@/lib/models/node-detail";
import { resultLabel, type PreparedModel } from "./prepare";
import { useViewerStore } from "./viewer-store";

/** Metres shown in millimetres. */
export const mm = (metres: number) => (metres * 1000).toFixed(1);
/** Kilonewtons shown to 0.01 kN. */
export const kN = (value: number) => value.toFixed(2);

/** Result ids in display order (load cases, then combinations) that the answer holds. */
export function orderedResultIds(model: PreparedModel["model"], results: Record<string, unknown>): string[] {
  return [...model.loadCases.map((c) => c.id), ...model.combinations.map((c) => c.id)].filter((id) => id in results);
}

function ResultCell({ model, id }: { model: PreparedModel["model"]; id: string }) {
  return (
    <td className="py-0.5 pr-2">
      <button type="button" className="text-left hover:underline" onClick={() => useViewerStore.getState().setResult(id)}>
        {resultLabel(model, id)}
      </button>
    </td>
  );
}

type Table<T> = { model: PreparedModel["model"]; rows: Record<string, T>; testId: string };

/** Displacement ux, uy, uz and |u| of one node per result. */
export function DisplacementTable({ model, rows, testId }: Table<NodeResult>) {
  const chosen = useViewerStore((s) => s.resultId);
  return (
    <table className="mb-3 w-full text-xs" data-testid={testId}>
      <thead>
        <tr className="text-left text-board-700">
          <th className="font-normal">Result</th>
          <th className="text-right font-normal">ux</th>
          <th className="text-right font-normal">uy</th>
          <th className="text-right font-normal">uz</th>
          <th className="text-right font-normal">|u| mm</th>
        </tr>
      </thead>
      <tbody>
        {orderedResultIds(model, rows).map((id) => {
          const d = rows[id].displacement;
          return (
            <tr key={id} data-testid={`${testId}-${id}`} className={id === chosen ? "bg-selection/10 font-semibold" : ""}>
              <ResultCell model={model} id={id} />
              <td className="text-right font-mono tabular-nums">{mm(d.ux)}</td>
              <td className="text-right font-mono tabular-nums">{mm(d.uy)}</td>
              <td className="text-right font-mono tabular-nums">{mm(d.uz)}</td>
              <td className="text-right font-mono tabular-nums">{mm(d.total)}</td>
            </tr>
          );
        })}
      </tbody>
    </table>
  );
}

/** Support reaction fx, fy, fz of one supported node per result (kN, on the structure). */
export function ReactionTable({ model, rows, testId }: Table<NodeResult>) {
  const chosen = useViewerStore((s) => s.resultId);
  return (
    <table className="mb-3 w-full text-xs" data-testid={testId}>
      <thead>
        <tr className="text-left text-board-700">
          <th className="font-normal">Result</th>
          <th className="text-right font-normal">Rx</th>
          <th className="text-right font-normal">Ry</th>
          <th className="text-right font-normal">Rz kN</th>
        </tr>
      </thead>
      <tbody>
        {orderedResultIds(model, rows).map((id) => {
          const r = rows[id].reaction;
          return (
            <tr key={id} data-testid={`${testId}-${id}`} className={id === chosen ? "bg-selection/10 font-semibold" : ""}>
              <ResultCell model={model} id={id} />
              <td className="text-right font-mono tabular-nums">{r ? kN(r.fx) : "–"}</td>
              <td className="text-right font-mono tabular-nums">{r ? kN(r.fy) : "–"}</td>
              <td className="text-right font-mono tabular-nums">{r ? kN(r.fz) : "–"}</td>
            </tr>
          );
        })}
      </tbody>
    </table>
  );
}

/** |u| at a member's two end nodes per result. */
export function EndDisplacementTable({ model, rows, ends, testId }: Table<{ i: NodeResult; j: NodeResult }> & { ends: { i: string; j: string } }) {
  const chosen = useViewerStore((s) => s.resultId);
  return (
    <table className="mb-3 w-full text-xs" data-testid={testId}>
      <thead>
        <tr className="text-left text-board-700">
          <th className="font-normal">Result</th>
          <th className="text-right font-normal">|u| at {ends.i}</th>
          <th className="text-right font-normal">|u| at {ends.j} mm</th>
        </tr>
      </thead>
      <tbody>
        {orderedResultIds(model, rows).map((id) => (
          <tr key={id} data-testid={`${testId}-${id}`} className={id === chosen ? "bg-selection/10 font-semibold" : ""}>
            <ResultCell model={model} id={id} />
            <td className="text-right font-mono tabular-nums">{mm(rows[id].i.displacement.total)}</td>
            <td className="text-right font-mono tabular-nums">{mm(rows[id].j.displacement.total)}</td>
          </tr>
        ))}
      </tbody>
    </table>
  );
}
