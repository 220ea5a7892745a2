"use client";
// Following and presenting. The presenter's camera, selected member and chosen result are sent at most ten times a
// second; followers hand each view to the viewer store, whose camera rig eases towards it (camera-controls'
// smooth transition), so motion stays fluid between updates. Stepping out stops applying views; stepping back
// in jumps to the presenter's latest one.
import { useEffect } from "react";
import type { SessionView } from "@/lib/realtime/events";
import { useViewerStore } from "@/components/viewer/viewer-store";
import { useSessionStore } from "./session-store";
import { send, type ReviewSocket } from "./use-review-socket";

export const followConfig = {
  /** Minimum time between two camera messages from the presenter. */
  sendIntervalMs: 100,
} as const;

function applyView(view: SessionView) {
  const viewer = useViewerStore.getState();
  viewer.setCameraPose(view.camera, { animate: true });
  if (viewer.selectedMemberId !== view.selectedMemberId) viewer.selectMember(view.selectedMemberId);
  if (view.resultId && viewer.resultId !== view.resultId) viewer.setResult(view.resultId);
}

function currentView(): SessionView | null {
  const { cameraPose, selectedMemberId, resultId } = useViewerStore.getState();
  return cameraPose ? { camera: cameraPose, selectedMemberId, resultId } : null;
}

/** Applies the presenter's views while following, and sends ours (throttled) while presenting. */
export function useFollowPresenter(socket: ReviewSocket | null): void {
  const presenterId = useSessionStore((s) => s.session?.presenterId ?? null);
  const meId = useSessionStore((s) => s.me?.id ?? null);
  const following = useSessionStore((s) => s.following);
  const presenting = presenterId !== null && presenterId === meId;

  // Follower: apply each view the presenter sends, and the latest one when stepping back in.
  useEffect(() => {
    if (!socket || presenting || !following || !presenterId) return;
    const latest = useSessionStore.getState().lastView;
    if (latest) applyView(latest);
    const onView = (view: SessionView) => applyView(view);
    socket.on("session:view", onView);
    // The 3D view may load after the session state: apply the latest view once its camera exists.
    const unsubscribe = useViewerStore.subscribe(
      (s) => s.controller,
      (controller) => {
        const view = useSessionStore.getState().lastView;
        if (controller && view) applyView(view);
      },
    );
    return () => {
      socket.off("session:view", onView);
      unsubscribe();
    };
  }, [socket, presenting, following, presenterId]);

  // Presenter: send the view when the camera, selection or result changes, at most every sendIntervalMs.
  useEffect(() => {
    if (!socket || !presenting) return;
    let lastSent = 0;
    let timer: ReturnType<typeof setTimeout> | null = null;
    const flush = () => {
      timer = null;
      lastSent = Date.now();
      const view = currentView();
      if (view) void send(socket, "session:view", view);
    };
    const schedule = () => {
      if (timer) return;
      timer = setTimeout(flush, Math.max(0, followConfig.sendIntervalMs - (Date.now() - lastSent)));
    };
    schedule();
    const unsubscribe = useViewerStore.subscribe(
      (s) => [s.cameraPose, s.selectedMemberId, s.resultId] as const,
      schedule,
      { equalityFn: (a, b) => a[0] === b[0] && a[1] === b[1] && a[2] === b[2] },
    );
    return () => {
      unsubscribe();
      if (timer) clearTimeout(timer);
    };
  }, [socket, presenting]);
}
