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

/** One row per result (the chosen one highlighted): the result's name, then `cells` of the row's numbers. */
function ResultRowsTable<T>({ model, rows, testId, headers, cells }: Table<T> & { headers: string[]; cells: (row: T) => string[] }) {
  const chosen = useViewerStore((s) => s.resultId);
  return (
    <table className="mb-3 w-full text-xs" data-testid={testId}>
      <thead>
        <tr className="text-left text-board-700">
          <th className="font-normal">Result</th>
          {headers.map((header) => (
            <th key={header} className="text-right font-normal">
              {header}
            </th>
          ))}
        </tr>
      </thead>
      <tbody>
        {orderedResultIds(model, rows).map((id) => (
          <tr key={id} data-testid={`${testId}-${id}`} className={id === chosen ? "bg-selection/10 font-semibold" : ""}>
            <ResultCell model={model} id={id} />
            {cells(rows[id]).map((cell, column) => (
              <td key={headers[column]} className="text-right font-mono tabular-nums">
                {cell}
              </td>
            ))}
          </tr>
        ))}
      </tbody>
    </table>
  );
}

/** Displacement ux, uy, uz and |u| of one node per result. */
export function DisplacementTable(props: Table<NodeResult>) {
  return <ResultRowsTable {...props} headers={["ux", "uy", "uz", "|u| mm"]} cells={({ displacement: d }) => [mm(d.ux), mm(d.uy), mm(d.uz), mm(d.total)]} />;
}

/** Support reaction fx, fy, fz of one supported node per result (kN, on the structure). */
export function ReactionTable(props: Table<NodeResult>) {
  return <ResultRowsTable {...props} headers={["Rx", "Ry", "Rz kN"]} cells={({ reaction: r }) => (r ? [kN(r.fx), kN(r.fy), kN(r.fz)] : ["–", "–", "–"])} />;
}

/** |u| at a member's two end nodes per result. */
export function EndDisplacementTable({ ends, ...props }: Table<{ i: NodeResult; j: NodeResult }> & { ends: { i: string; j: string } }) {
  return <ResultRowsTable {...props} headers={[`|u| at ${ends.i}`, `|u| at ${ends.j} mm`]} cells={({ i, j }) => [mm(i.displacement.total), mm(j.displacement.total)]} />;
}
