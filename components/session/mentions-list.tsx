"use client";
// Unread mentions of the signed-in person (loaded with the page, then pushed live): opening one shows its thread
// and marks it read on the server.
import { useEffect } from "react";
import { apiFetch } from "@/lib/http/fetcher";
import type { PresentedNotification } from "@/lib/realtime/events";
import { useSessionStore } from "./session-store";

export function MentionsList({ projectId }: { projectId: string }) {
  const notifications = useSessionStore((s) => s.notifications);
  const unread = notifications.filter((n) => !n.readAt && n.payload.projectId === projectId);

  useEffect(() => {
    apiFetch<{ notifications: PresentedNotification[] }>("/api/notifications?unread=1")
      .then((answer) => useSessionStore.getState().addNotifications(answer.notifications))
      .catch(() => undefined);
  }, []);

  async function open(notification: PresentedNotification) {
    useSessionStore.getState().selectPin(notification.payload.pinId);
    const { notification: read } = await apiFetch<{ notification: PresentedNotification }>(`/api/notifications/${notification.id}`, {
      method: "PATCH",
      body: { read: true },
    });
    useSessionStore.getState().markNotificationRead(read);
  }

  if (unread.length === 0) return null;
  return (
    <section aria-label="Mentions" data-testid="mentions">
      <h3 className="text-xs font-semibold uppercase tracking-wide text-board-700">Asked of you ({unread.length})</h3>
      <ul className="mt-1 flex flex-col gap-1">
        {unread.map((n) => (
          <li key={n.id}>
            <button type="button" className="w-full rounded-md border border-board-200 px-2 py-1 text-left text-sm hover:bg-board-100" onClick={() => void open(n)}>
              <span className="block text-xs text-board-700">{n.payload.byName} mentioned you</span>
              <span className="block truncate">{n.payload.excerpt}</span>
            </button>
          </li>
        ))}
      </ul>
    </section>
  );
}
