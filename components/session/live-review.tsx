"use client";
// The viewer in a live review: the model viewer with the pins layer inside its canvas, and beside it the review
// panel (connection, who is here, the session, pins and threads, shared notes).
import { useQuery } from "@tanstack/react-query";
import { useSearchParams } from "next/navigation";
import { useEffect, useMemo } from "react";
import { ModelViewer } from "@/components/viewer/model-viewer";
import { fetchRevision, revisionQueryKey } from "@/components/viewer/viewed-revision";
import { PinsLayer, type PinMarker } from "@/components/viewer/layers/pins-layer";
import { MepViewerLayer } from "@/components/clashes/mep-viewer-layer";
import { apiFetch } from "@/lib/http/fetcher";
import { resolveAnchor } from "@/lib/realtime/anchors";
import type { Vec3 } from "@/lib/realtime/events";
import { MentionsList } from "./mentions-list";
import { NewPinForm } from "./new-pin-form";
import { PinList } from "./pin-list";
import { PinThread } from "./pin-thread";
import { PresenceList } from "./presence-list";
import { SessionControls } from "./session-controls";
import { SessionNotes } from "./session-notes";
import { useSessionStore, type ConnectionState } from "./session-store";
import { useFollowPresenter } from "./use-follow-presenter";
import { useReviewSocket } from "./use-review-socket";

const CONNECTION_TEXT: Record<ConnectionState, string> = {
  connecting: "Connecting to the live review…",
  connected: "Live",
  reconnecting: "Connection lost: reconnecting (your changes are kept and sent when it is back)…",
  refused: "The live review refused the connection",
};

type ClashList = { clashes: { clashKey: string; point: { x: number; y: number; z: number } }[] };

export function LiveReview({
  projectId,
  revisionNumber,
  openingResultId = null,
  realtimeUrl,
  focusClash = null,
}: {
  projectId: string;
  revisionNumber: number;
  /** The result whose columns the page preloaded (the viewer's opening choice). */
  openingResultId?: string | null;
  realtimeUrl: string;
  focusClash?: string | null;
}) {
  const socket = useReviewSocket(projectId, realtimeUrl);
  // A link to one pin (from the review overview or a mention mail) opens its thread.
  const pinParam = useSearchParams().get("pin");
  useEffect(() => {
    if (pinParam) useSessionStore.getState().selectPin(pinParam);
  }, [pinParam, socket]);
  useFollowPresenter(socket);
  const connection = useSessionStore((s) => s.connection);
  const refusal = useSessionStore((s) => s.refusal);
  const pins = useSessionStore((s) => s.pins);
  const selectedPinId = useSessionStore((s) => s.selectedPinId);
  const abilities = useSessionStore((s) => s.abilities);

  // Same key as the model viewer: the revision is fetched once and shared.
  const revision = useQuery({
    queryKey: revisionQueryKey(projectId, revisionNumber),
    queryFn: () => fetchRevision(projectId, revisionNumber),
    staleTime: Infinity,
  }).data;
  const clashes = useQuery({
    queryKey: ["projects", projectId, "clashes", revisionNumber, "points"],
    queryFn: () => apiFetch<ClashList>(`/api/projects/${projectId}/clashes?revision=${revisionNumber}`),
    retry: false,
  }).data;

  const { markers, positions, detached } = useMemo(() => {
    const clashPoints = new Map<string, Vec3>((clashes?.clashes ?? []).map((c) => [c.clashKey, [c.point.x, c.point.y, c.point.z]]));
    const positions = new Map<string, Vec3>();
    const detached = new Set<string>();
    if (revision) {
      for (const pin of Object.values(pins)) {
        const position = resolveAnchor(pin.anchor, revision.model, clashPoints);
        if (position) positions.set(pin.id, position);
        else detached.add(pin.id);
      }
    }
    const markers: PinMarker[] = Object.values(pins)
      .filter((pin) => positions.has(pin.id))
      .map((pin) => ({ id: pin.id, title: pin.title, state: pin.state, position: positions.get(pin.id)! }));
    return { markers, positions, detached };
  }, [pins, revision, clashes]);

  const selectedPin = selectedPinId ? pins[selectedPinId] : undefined;
  const layers = (
    <>
      <PinsLayer pins={markers} selectedPinId={selectedPinId} onSelectPin={(id) => useSessionStore.getState().selectPin(id)} />
      <MepViewerLayer projectId={projectId} revision={revisionNumber} focusClash={focusClash} />
    </>
  );

  return (
    <div className="flex flex-col gap-3 xl:flex-row">
      <div className="min-w-0 flex-1 overflow-hidden rounded-xl border border-board-200 bg-white">
        <ModelViewer projectId={projectId} revisionNumber={revisionNumber} openingResultId={openingResultId} layers={layers} />
      </div>
      <aside className="flex w-full flex-col gap-4 rounded-xl border border-board-200 bg-white p-3 xl:w-96" aria-label="Live review" data-testid="review-panel">
        <p className="text-sm" role="status" data-testid="connection-state" data-state={connection}>
          <span className={`mr-1 inline-block h-2 w-2 rounded-full ${connection === "connected" ? "bg-tension" : connection === "refused" ? "bg-clash" : "bg-compression"}`} />
          {CONNECTION_TEXT[connection]}
          {refusal ? `: ${refusal}` : ""}
        </p>
        <SessionControls socket={socket} />
        {/* The pin form comes before the lists that grow (mentions, pins): a few Tab presses from the 3D view. */}
        {socket && abilities["pin.create"] ? <NewPinForm socket={socket} revisionId={revision?.id ?? null} /> : null}
        <MentionsList projectId={projectId} />
        <PresenceList />
        {selectedPin && socket ? <PinThread key={selectedPin.id} socket={socket} projectId={projectId} pin={selectedPin} position={positions.get(selectedPin.id) ?? null} /> : null}
        <PinList detached={detached} />
        <SessionNotes projectId={projectId} realtimeUrl={realtimeUrl} canEdit={Boolean(abilities["comment.create"])} />
      </aside>
    </div>
  );
}
