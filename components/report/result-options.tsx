// The results (combinations and load cases) a report or export can be made of, as <option>s: shared by the PDF
// report's comparison and the export forms.

export type ResultOption = { id: string; name: string; kind: "combination" | "load case" };

export const selectClass = "rounded-md border border-board-200 bg-white px-3 py-2 text-sm";

/** One <option> per result, "id: name". */
export function ResultOptions({ results }: { results: ResultOption[] }) {
  return results.map((r) => (
    <option key={r.id} value={r.id}>
      {r.id}: {r.name}
    </option>
  ));
}
