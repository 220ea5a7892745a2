"use client";
// The clash review screen: the viewer with the MEP layer, the clash table, the selected clash's decision panel,
// importing runs, re-running detection and hanging the services. What a user may do comes from the server.
import { useMutation, useQuery, useQueryClient } from "@tanstack/react-query";
import { useEffect, useState } from "react";
import { Button, FormMessage } from "@/components/ui/form";
import { ModelViewer } from "@/components/viewer/model-viewer";
import { useViewerStore } from "@/components/viewer/viewer-store";
import { useLiveInvalidation } from "@/components/live/use-live-invalidation";
import { apiFetch } from "@/lib/http/fetcher";
import { ClashTable } from "./clash-table";
import { CopyRunsForm } from "./copy-runs-form";
import { DrawRunForm } from "./draw-run-form";
import { useClashStore } from "./clash-store";
import { DecisionPanel } from "./decision-panel";
import { HangServicesButton } from "./hang-services-button";
import { ImportIfcRunsForm } from "./import-ifc-runs-form";
import { ImportRunsForm } from "./import-runs-form";
import { MepViewerLayer } from "./mep-viewer-layer";
import { RunsPanel } from "./runs-panel";
import { clashesQueryKey, runsQueryKey, type ClashListResponse, type ClashRowData, type RunListResponse } from "./types";

/** Selects the clash everywhere: table row, markers, the member in the viewer, and flies the camera to it. */
function focusClash(row: ClashRowData) {
  useClashStore.getState().selectClash(row.clashKey);
  const viewer = useViewerStore.getState();
  viewer.selectMember(row.memberId);
  viewer.flyTo([row.point.x, row.point.y, row.point.z]);
}

export function ClashBoard({ projectId, revision, realtimeUrl, otherRevisions, initialClash }: { projectId: string; revision: number; realtimeUrl: string; otherRevisions: number[]; initialClash: string | null }) {
  const queryClient = useQueryClient();
  // Another person's proposal or decision shows here without a reload.
  useLiveInvalidation(projectId, realtimeUrl);
  const [lowForce, setLowForce] = useState(5);
  const clashes = useQuery({
    queryKey: clashesQueryKey(projectId, revision, lowForce),
    queryFn: () => apiFetch<ClashListResponse>(`/api/projects/${projectId}/clashes?revision=${revision}&lowForce=${lowForce}`),
  });
  const runs = useQuery({ queryKey: runsQueryKey(projectId, revision), queryFn: () => apiFetch<RunListResponse>(`/api/projects/${projectId}/runs?revision=${revision}`) });
  const selectedKey = useClashStore((s) => s.selectedClashId);
  const rows = clashes.data?.clashes;
  const selected = rows?.find((r) => r.clashKey === selectedKey) ?? null;
  const refresh = () => {
    void queryClient.invalidateQueries({ queryKey: ["projects", projectId, "clashes"] });
    void queryClient.invalidateQueries({ queryKey: runsQueryKey(projectId, revision) });
  };
  const detect = useMutation({ mutationFn: () => apiFetch(`/api/projects/${projectId}/clashes`, { method: "POST", body: { revision } }), onSuccess: refresh });

  // A link to a clash (?clash=<stable id>, e.g. from a pin) selects it once the list is here.
  useEffect(() => {
    const row = initialClash ? rows?.find((r) => r.clashKey === initialClash) : undefined;
    if (row) focusClash(row);
  }, [initialClash, rows]);

  return (
    <div className="flex flex-col gap-4">
      {clashes.data && (
        <p className="rounded-md border border-compression/30 bg-compression/5 px-3 py-2 text-sm text-board-800" data-testid="standing-caution">
          {clashes.data.caution}
        </p>
      )}
      <div className="overflow-hidden rounded-xl border border-board-200 bg-white">
        <ModelViewer
          projectId={projectId}
          revisionNumber={revision}
          layers={<MepViewerLayer projectId={projectId} revision={revision} />}
        />
      </div>
      {clashes.isPending ? (
        <p className="text-sm text-board-700">Loading clashes…</p>
      ) : clashes.isError ? (
        <FormMessage message={clashes.error.message} />
      ) : (
        <div className="grid gap-4 lg:grid-cols-[minmax(0,2fr)_minmax(0,1fr)]">
          <div className="flex flex-col gap-3">
            <div className="flex flex-wrap items-end gap-3">
              <label className="flex flex-col text-xs text-board-700">
                Low-force below (kN)
                <input type="number" min={0} step={1} value={lowForce} onChange={(e) => setLowForce(Math.max(0, Number(e.target.value) || 0))} className="mt-1 w-24 rounded border border-board-200 px-2 py-1 text-sm text-board-900" data-testid="low-force-threshold" />
              </label>
              <span className="text-sm text-board-700">{runs.data ? `${runs.data.runs.length} run(s) on revision ${revision}` : ""}</span>
              {clashes.data.abilities.editRuns && (
                <Button type="button" variant="quiet" onClick={() => detect.mutate()} disabled={detect.isPending} data-testid="redetect">
                  {detect.isPending ? "Detecting…" : "Re-run clash detection"}
                </Button>
              )}
            </div>
            <ClashTable rows={clashes.data.clashes} selectedId={selected?.id ?? null} onSelect={focusClash} threadHref={(row) => `/projects/${projectId}/viewer?revision=${revision}&clash=${row.clashKey}`} />
          </div>
          <div className="flex flex-col gap-4">
            {selected ? (
              <DecisionPanel projectId={projectId} clash={selected} list={clashes.data} />
            ) : (
              <p className="rounded-xl border border-dashed border-board-200 p-4 text-sm text-board-700">Choose a clash in the table or a rose marker in the 3D view to see and decide it.</p>
            )}
            {clashes.data.abilities.editRuns && (
              <section className="rounded-xl border border-board-200 bg-white p-4" aria-label="Import runs">
                <h2 className="mb-2 font-semibold text-board-900">Duct and pipe runs</h2>
                {runs.data?.runs.length === 0 && otherRevisions.length > 0 && <CopyRunsForm projectId={projectId} revision={revision} sources={otherRevisions} onCopied={refresh} />}
                <RunsPanel projectId={projectId} revision={revision} runs={runs.data?.runs ?? []} canEdit onChanged={refresh} />
                <h3 className="mb-1 mt-4 text-sm font-semibold text-board-900">Import</h3>
                <ImportRunsForm projectId={projectId} revision={revision} onImported={refresh} />
                <h3 className="mb-1 mt-4 text-sm font-semibold text-board-900">Import from IFC</h3>
                <ImportIfcRunsForm projectId={projectId} revision={revision} onImported={refresh} />
                <h3 className="mb-1 mt-4 text-sm font-semibold text-board-900">Draw a run in the 3D view</h3>
                <DrawRunForm projectId={projectId} revision={revision} onSaved={refresh} />
              </section>
            )}
            {clashes.data.abilities.hangServices && (runs.data?.runs.length ?? 0) > 0 && (
              <section className="rounded-xl border border-board-200 bg-white p-4" aria-label="Hang the services">
                <h2 className="mb-2 font-semibold text-board-900">Hang the services</h2>
                <HangServicesButton projectId={projectId} revision={revision} />
              </section>
            )}
          </div>
        </div>
      )}
    </div>
  );
}
