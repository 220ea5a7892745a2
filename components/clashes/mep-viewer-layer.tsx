"use client";
// The MEP layer for any viewer screen: fetches the revision's runs and active clashes itself and draws them
// (runs translucent sky, clashes rose), and the runs of an IFC file being previewed. With `focusClash` (a stable clash id, e.g. from ?clash=) it selects that
// clash and its member and flies the camera there once the data is in.
import { useQuery } from "@tanstack/react-query";
import { useEffect, useMemo } from "react";
import { MepRunsLayer } from "@/components/viewer/layers/mep-runs-layer";
import { RunDraftLayer } from "@/components/viewer/layers/run-draft-layer";
import { useViewerStore } from "@/components/viewer/viewer-store";
import { apiFetch } from "@/lib/http/fetcher";
import { useClashStore } from "./clash-store";
import { useRunPreviewStore } from "./run-preview-store";
import { clashesQueryKey, runsQueryKey, type ClashListResponse, type RunListResponse } from "./types";

// The force-state threshold does not matter for drawing; the clash table's default keeps the cache shared.
const DEFAULT_LOW_FORCE = 5;

export function MepViewerLayer({ projectId, revision, focusClash }: { projectId: string; revision: number; focusClash?: string | null }) {
  const runs = useQuery({ queryKey: runsQueryKey(projectId, revision), queryFn: () => apiFetch<RunListResponse>(`/api/projects/${projectId}/runs?revision=${revision}`) });
  const clashes = useQuery({
    queryKey: clashesQueryKey(projectId, revision, DEFAULT_LOW_FORCE),
    queryFn: () => apiFetch<ClashListResponse>(`/api/projects/${projectId}/clashes?revision=${revision}&lowForce=${DEFAULT_LOW_FORCE}`),
  });
  const selectedKey = useClashStore((s) => s.selectedClashId);
  const previewRuns = useRunPreviewStore((s) => s.runs);
  const rows = clashes.data?.clashes;
  const markers = useMemo(() => (rows ?? []).filter((r) => r.status === "active").map((r) => ({ id: r.clashKey, kind: r.kind, point: r.point })), [rows]);

  const select = (key: string) => {
    const row = rows?.find((r) => r.clashKey === key);
    if (!row) return;
    useClashStore.getState().selectClash(key);
    const viewer = useViewerStore.getState();
    viewer.selectMember(row.memberId);
    viewer.flyTo([row.point.x, row.point.y, row.point.z]);
  };

  useEffect(() => {
    const row = focusClash ? rows?.find((r) => r.clashKey === focusClash) : undefined;
    if (!row) return;
    useClashStore.getState().selectClash(row.clashKey);
    useViewerStore.getState().selectMember(row.memberId);
    useViewerStore.getState().flyTo([row.point.x, row.point.y, row.point.z]);
  }, [focusClash, rows]);

  return (
    <>
      <MepRunsLayer runs={runs.data?.runs ?? []} clashes={markers} selectedClashId={selectedKey} onSelectClash={select} />
      {previewRuns.length > 0 && <MepRunsLayer runs={previewRuns} clashes={[]} selectedClashId={null} />}
      <RunDraftLayer />
    </>
  );
}
