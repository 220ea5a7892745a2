"use client";
// The live review's state in the browser: connection, who is here, the session, pins and threads, notifications.
// Filled by use-review-socket.ts from the server's events; read by the panel and the pins layer.
import { create } from "zustand";
import type { Socket } from "socket.io-client";
import type {
  ClientToServerEvents,
  ServerToClientEvents,
  PinFilter,
  PresenceEntry,
  PresentedComment,
  PresentedNotification,
  PresentedPin,
  PresentedReviewSession,
  SessionView,
  Welcome,
} from "@/lib/realtime/events";

export type ReviewSocket = Socket<ServerToClientEvents, ClientToServerEvents>;

export type ConnectionState = "connecting" | "connected" | "reconnecting" | "refused";

export interface SessionState {
  /** The open socket of the live review (created and closed by useReviewSocket). */
  socket: ReviewSocket | null;
  connection: ConnectionState;
  /** Why the server refused us (signed out, not on the team), when it did. */
  refusal: string | null;
  me: Welcome["user"] | null;
  abilities: Record<string, boolean>;
  session: PresentedReviewSession | null;
  /** The presenter's latest view, applied again when a follower steps back in. */
  lastView: SessionView | null;
  presence: PresenceEntry[];
  following: boolean;
  pins: Record<string, PresentedPin>;
  comments: Record<string, PresentedComment[]>;
  notifications: PresentedNotification[];
  selectedPinId: string | null;
  filter: PinFilter;
  /** Server time of the last welcome or catch-up: a reconnect asks for everything after it. */
  lastServerTime: string | null;

  /** A fresh state for another project (or null socket when leaving). */
  reset(socket: ReviewSocket | null): void;
  setConnection(connection: ConnectionState, refusal?: string | null): void;
  welcome(welcome: Welcome): void;
  setSession(session: PresentedReviewSession | null): void;
  setLastView(view: SessionView): void;
  setPresence(entries: PresenceEntry[]): void;
  setFollowing(following: boolean): void;
  upsertPins(pins: PresentedPin[]): void;
  addComments(comments: PresentedComment[]): void;
  setThread(pinId: string, comments: PresentedComment[]): void;
  addNotifications(notifications: PresentedNotification[]): void;
  markNotificationRead(notification: PresentedNotification): void;
  selectPin(id: string | null): void;
  setFilter(patch: Partial<PinFilter>): void;
  setServerTime(time: string): void;
}

const initial = {
  connection: "connecting" as ConnectionState,
  refusal: null,
  me: null,
  abilities: {},
  session: null,
  lastView: null,
  presence: [],
  following: true,
  pins: {},
  comments: {},
  notifications: [],
  selectedPinId: null,
  filter: {},
  lastServerTime: null,
};

export const useSessionStore = create<SessionState>()((set, get) => ({
  ...initial,
  socket: null,
  reset: (socket) => set({ ...initial, socket }),
  setConnection: (connection, refusal = null) => set({ connection, refusal }),
  welcome: (welcome) =>
    set({ me: welcome.user, abilities: welcome.abilities, session: welcome.session, lastView: welcome.session?.view ?? null }),
  setSession: (session) => set({ session, ...(session?.view ? { lastView: session.view } : {}) }),
  setLastView: (view) => set({ lastView: view }),
  setPresence: (presence) => set({ presence }),
  setFollowing: (following) => set({ following }),
  upsertPins: (pins) => {
    if (pins.length === 0) return;
    const next = { ...get().pins };
    // Keep the newer copy: events and catch-up may arrive in either order.
    for (const pin of pins) if (!next[pin.id] || next[pin.id].updatedAt <= pin.updatedAt) next[pin.id] = pin;
    set({ pins: next });
  },
  addComments: (comments) => {
    if (comments.length === 0) return;
    const next = { ...get().comments };
    for (const comment of comments) {
      const thread = next[comment.pinId] ?? [];
      if (thread.some((c) => c.id === comment.id)) continue;
      next[comment.pinId] = [...thread, comment].sort((a, b) => a.createdAt.localeCompare(b.createdAt));
    }
    set({ comments: next });
  },
  setThread: (pinId, comments) => set({ comments: { ...get().comments, [pinId]: comments } }),
  addNotifications: (notifications) => {
    const known = new Set(get().notifications.map((n) => n.id));
    set({ notifications: [...notifications.filter((n) => !known.has(n.id)), ...get().notifications] });
  },
  markNotificationRead: (read) => set({ notifications: get().notifications.map((n) => (n.id === read.id ? read : n)) }),
  selectPin: (id) => set({ selectedPinId: id }),
  setFilter: (patch) => set({ filter: { ...get().filter, ...patch } }),
  setServerTime: (time) => set({ lastServerTime: time }),
}));

/** The pins that pass the current filters, oldest first. */
export function filterPins(pins: Record<string, PresentedPin>, filter: PinFilter): PresentedPin[] {
  return Object.values(pins)
    .filter((pin) => (!filter.state || pin.state === filter.state) && (!filter.discipline || pin.discipline === filter.discipline) && (!filter.authorId || pin.author.id === filter.authorId))
    .sort((a, b) => a.createdAt.localeCompare(b.createdAt));
}

/**
 * A pin's comment count as far as this browser knows: the count the server gave with this copy of the pin, plus the
 * comments heard of since that copy was read (written after its updatedAt: every comment marks its pin changed, so
 * the copy's count holds the comments up to then). A comment does not send the pin again (it would double the
 * comment's fan-out); a fresh copy of the pin (catch-up, a state change) starts the count again from the server's.
 */
export function commentCountOf(pin: PresentedPin, thread: readonly PresentedComment[] | undefined): number {
  return pin.commentCount + (thread ?? []).filter((comment) => comment.createdAt > pin.updatedAt).length;
}
