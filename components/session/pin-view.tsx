"use client";
// A pin's saved view: restore it with one click (camera, result, colouring, selected member, section box) and, for
// the pin's author, the owner or the structural engineer (the server says who), save the viewer's current view with
// a snapshot of the canvas. The view travels in BCF exports as a viewpoint with its snapshot.
import { useMutation, useQuery, useQueryClient } from "@tanstack/react-query";
import { Button, FieldError } from "@/components/ui/form";
import type { ColourMode } from "@/components/viewer/colouring";
import { useViewerStore } from "@/components/viewer/viewer-store";
import type { Viewpoint, SavePinViewInput } from "@/lib/bcf";
import { apiFetch } from "@/lib/http/fetcher";

interface SavedView {
  viewpoint: Viewpoint | null;
  snapshotUrl: string | null;
  canSave: boolean;
}

const COLOUR_MODES: readonly ColourMode[] = ["forceState", "magnitude", "utilisation", "zeroInAll", "verdict", "compare", "deltaForce"];

/** The viewer's current view as a pin keeps it, or null before the camera is up. */
export function currentView(): Viewpoint | null {
  const s = useViewerStore.getState();
  if (!s.cameraPose) return null;
  return {
    camera: { position: s.cameraPose.position, target: s.cameraPose.target },
    ...(s.selectedMemberId ? { selectedMember: s.selectedMemberId } : {}),
    ...(s.resultId ? { result: s.resultId } : {}),
    colouring: s.colourMode,
    ...(s.filters.sectionBox ? { sectionBox: s.filters.sectionBox } : {}),
  };
}

/** Puts the viewer back into a saved view. */
export function restoreView(view: Viewpoint): void {
  const s = useViewerStore.getState();
  if (view.result) s.setResult(view.result);
  const colouring = COLOUR_MODES.find((m) => m === view.colouring);
  if (colouring) s.setColourMode(colouring);
  s.setFilters({ sectionBox: view.sectionBox ?? null });
  s.selectMember(view.selectedMember ?? null);
  s.setCameraPose({ position: view.camera.position, target: view.camera.target }, { animate: true });
}

export function PinView({ projectId, pinId }: { projectId: string; pinId: string }) {
  const queryClient = useQueryClient();
  const key = ["projects", projectId, "pins", pinId, "viewpoint"] as const;
  const saved = useQuery({ queryKey: key, queryFn: () => apiFetch<SavedView>(`/api/projects/${projectId}/pins/${pinId}/viewpoint`) });
  const save = useMutation({
    mutationFn: () => {
      const viewpoint = currentView();
      if (!viewpoint) throw new Error("The 3D view is not ready yet; wait for the model to appear.");
      const snapshot = useViewerStore.getState().exportPng() ?? undefined;
      const body: SavePinViewInput = { viewpoint, ...(snapshot ? { snapshot } : {}) };
      return apiFetch(`/api/projects/${projectId}/pins/${pinId}/viewpoint`, { method: "PUT", body });
    },
    onSuccess: () => queryClient.invalidateQueries({ queryKey: key }),
  });
  const view = saved.data?.viewpoint ?? null;
  return (
    <div className="flex flex-col gap-1" data-testid="pin-view">
      <div className="flex flex-wrap items-center gap-1">
        {saved.isPending ? <span className="text-xs text-board-700">Loading the saved view…</span> : null}
        {view ? (
          <Button variant="quiet" onClick={() => restoreView(view)} data-testid="pin-view-restore">
            Go to the saved view
          </Button>
        ) : saved.data ? (
          <span className="text-xs text-board-700" data-testid="pin-view-none">No view saved on this pin.</span>
        ) : null}
        {saved.data?.canSave ? (
          <Button variant="quiet" onClick={() => save.mutate()} disabled={save.isPending} data-testid="pin-view-save">
            {save.isPending ? "Saving the view…" : view ? "Replace with this view" : "Save this view"}
          </Button>
        ) : null}
      </div>
      {saved.data?.snapshotUrl ? (
        // eslint-disable-next-line @next/next/no-img-element -- a short-lived presigned link; next/image would proxy it
        <img src={saved.data.snapshotUrl} alt="Snapshot of the saved view" className="max-h-32 rounded border border-board-200 object-contain" data-testid="pin-view-snapshot" />
      ) : null}
      <FieldError message={save.error?.message ?? saved.error?.message} />
    </div>
  );
}
