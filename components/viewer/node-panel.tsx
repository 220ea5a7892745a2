"use client";
// The side panel of the selected node: where it is, how it is supported, the load on it in the chosen result, its
// displacement and (at a support) its reaction in every result from the node's own endpoint, and the members that
// meet there (a click selects one).
import { useQuery } from "@tanstack/react-query";
import { apiFetch } from "@/lib/http/fetcher";
import type { NodeDetail } from "@/lib/models/node-detail";
import { formatMetres } from "./measure";
import { DisplacementTable, ReactionTable } from "./node-results-tables";
import { LoadFailure } from "./load-failure";
import { nodalLoadsFor, resultLabel, type PreparedModel } from "./prepare";
import { useViewerStore } from "./viewer-store";

const held = (value: boolean) => (value ? "held" : "free");

export function NodePanel({ projectId, revisionNumber, prepared }: { projectId: string; revisionNumber: number; prepared: PreparedModel }) {
  const selected = useViewerStore((s) => s.selectedNodeId);
  const resultId = useViewerStore((s) => s.resultId);
  const k = selected ? prepared.nodes.index.get(selected) : undefined;
  const detailQuery = useQuery({
    queryKey: ["projects", projectId, "models", revisionNumber, "nodes", selected],
    queryFn: () => apiFetch<NodeDetail>(`/api/projects/${projectId}/models/${revisionNumber}/nodes/${encodeURIComponent(selected!)}`),
    enabled: selected !== null && k !== undefined,
    staleTime: Infinity,
  });
  if (!selected || k === undefined) return null;
  const p = prepared.nodes.positions;
  const support = prepared.model.supports.find((s) => s.node === selected);
  const load = resultId ? nodalLoadsFor(prepared.model, resultId).find((l) => l.node === selected) : undefined;
  const detail = detailQuery.data;
  const members = prepared.model.members.filter((m) => m.i === selected || m.j === selected);
  return (
    <aside data-testid="node-panel" aria-label={`Node ${selected}`} className="absolute inset-y-0 right-0 z-20 w-80 max-w-full overflow-y-auto border-l border-board-200 bg-white p-4 text-sm shadow-lg">
      <header className="mb-3 flex items-start justify-between">
        <div>
          <h2 className="text-lg font-semibold" data-testid="node-panel-id">Node {selected}</h2>
          <p className="font-mono text-xs text-board-700" data-testid="node-panel-position">
            x {formatMetres(p[k * 3])} · y {formatMetres(p[k * 3 + 1])} · z {formatMetres(p[k * 3 + 2])}
          </p>
        </div>
        <button type="button" className="rounded px-2 text-board-700 hover:bg-board-100" aria-label="Close the node panel" onClick={() => useViewerStore.getState().selectNode(null)}>
          ×
        </button>
      </header>
      <p>{support ? `Support: x ${held(support.ux)}, y ${held(support.uy)}, z ${held(support.uz)}` : "Not a support."}</p>
      {resultId ? (
        <p className="mt-2">
          {load ? `Nodal load in ${resultLabel(prepared.model, resultId)}: ${load.fx.toFixed(2)}, ${load.fy.toFixed(2)}, ${load.fz.toFixed(2)} kN (x, y, z)` : `No nodal load in ${resultLabel(prepared.model, resultId)}.`}
        </p>
      ) : null}
      {detailQuery.isPending ? <p className="mt-2 text-xs text-board-700">Loading this node&apos;s results…</p> : null}
      {detailQuery.isError ? <LoadFailure error={detailQuery.error} retry={() => void detailQuery.refetch()} className="mt-2" /> : null}
      {detail ? (
        <>
          {detail.support ? (
            <>
              <h3 className="mt-3 font-semibold">Support reaction (kN, on the roof)</h3>
              <ReactionTable model={prepared.model} rows={detail.results} testId="node-panel-reactions" />
            </>
          ) : null}
          <h3 className="mt-3 font-semibold">Displacement (mm)</h3>
          <DisplacementTable model={prepared.model} rows={detail.results} testId="node-panel-displacements" />
        </>
      ) : null}
      <h3 className="mt-3 font-semibold">Members meeting here ({members.length})</h3>
      <ul className="mt-1 flex flex-wrap gap-1">
        {members.map((m) => (
          <li key={m.id}>
            <button type="button" className="rounded border border-board-200 px-1.5 font-mono text-xs hover:bg-board-100" onClick={() => useViewerStore.getState().selectMember(m.id)}>
              {m.id}
            </button>
          </li>
        ))}
      </ul>
    </aside>
  );
}
