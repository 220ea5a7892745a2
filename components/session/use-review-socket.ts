"use client";
// The socket.io connection of a live review: created in an effect and closed on cleanup, reconnecting with
// exponential back-off (socket.io's own, 0.5 s doubling to 10 s, jittered), catching up on what was missed after
// each reconnect. Writes made while offline wait in socket.io's send buffer and go out on reconnect; their
// client-made ids make a resend harmless.
import { useQueryClient } from "@tanstack/react-query";
import { useEffect } from "react";
import { staleQueryKeys } from "@/components/live/invalidation";
import { io } from "socket.io-client";
import { apiFetch } from "@/lib/http/fetcher";
import type { Ack, CatchUp, ClientToServerEvents, PresentedPin } from "@/lib/realtime/events";
import { SOCKET_PATH } from "@/lib/realtime/events";
import { useSessionStore, type ReviewSocket } from "./session-store";

export type { ReviewSocket };

/** Sends an event and resolves with the server's acknowledgement (after the reconnect, when offline). */
export function send<T>(socket: ReviewSocket, event: keyof ClientToServerEvents, payload: unknown): Promise<Ack<T>> {
  return socket.emitWithAck(event as "pin:create", payload) as Promise<Ack<T>>;
}

const RECONNECT = { reconnectionDelay: 500, reconnectionDelayMax: 10_000, randomizationFactor: 0.5 } as const;

/** Connects to the project's room; returns the socket once created (null before the effect has run). */
export function useReviewSocket(projectId: string, realtimeUrl: string): ReviewSocket | null {
  const queryClient = useQueryClient();
  useEffect(() => {
    const store = useSessionStore.getState;
    const client: ReviewSocket = io(realtimeUrl, {
      path: SOCKET_PATH,
      auth: { projectId },
      withCredentials: true,
      // The realtime server speaks websockets only (no sticky sessions needed across nodes).
      transports: ["websocket"],
      ...RECONNECT,
    });
    let welcomed = false;
    useSessionStore.getState().reset(client);

    // The page load: pins from the route handler (the socket then keeps them current).
    apiFetch<{ pins: PresentedPin[] }>(`/api/projects/${projectId}/pins`)
      .then(({ pins }) => store().upsertPins(pins))
      .catch(() => undefined);

    client.on("welcome", async (welcome) => {
      const since = store().lastServerTime;
      store().welcome(welcome);
      store().setConnection("connected");
      if (welcomed && since) {
        const catchUp = await send<CatchUp>(client, "sync:since", { since });
        if (catchUp.ok) {
          store().upsertPins(catchUp.data.pins);
          store().addComments(catchUp.data.comments);
          store().setServerTime(catchUp.data.serverTime);
          return;
        }
      }
      welcomed = true;
      store().setServerTime(welcome.serverTime);
    });
    client.on("presence", (entries) => store().setPresence(entries));
    client.on("session:state", (session) => store().setSession(session));
    client.on("session:view", (view) => store().setLastView(view));
    client.on("pin:created", (pin) => store().upsertPins([pin]));
    client.on("pin:updated", (pin) => store().upsertPins([pin]));
    client.on("comment:created", (comment) => store().addComments([comment]));
    client.on("notification:created", (notification) => store().addNotifications([notification]));
    // Changes made through the web app (a clash decided, runs imported, the team changed): refetch them.
    client.on("live:invalidate", async (invalidation) => {
      for (const queryKey of staleQueryKeys(projectId, invalidation)) void queryClient.invalidateQueries({ queryKey });
      // Pins and threads written over HTTP (a BCF import): the socket's own catch-up brings them into the board.
      const since = store().lastServerTime;
      if (invalidation.kind !== "pins" || !since) return;
      const catchUp = await send<CatchUp>(client, "sync:since", { since });
      if (!catchUp.ok) return;
      store().upsertPins(catchUp.data.pins);
      store().addComments(catchUp.data.comments);
      store().setServerTime(catchUp.data.serverTime);
    });
    client.on("access:changed", (access) => store().welcome({ ...access, session: store().session, serverTime: store().lastServerTime ?? new Date().toISOString() }));
    client.on("access:revoked", ({ message }) => store().setConnection("refused", message));
    client.on("realtime:error", (error) => console.warn(`[review] ${error.event}: ${error.error}`));
    client.on("disconnect", (reason) => {
      // The server closed it (removed from the team): final, and the refusal message is already shown.
      if (reason !== "io server disconnect") store().setConnection("reconnecting");
    });
    client.io.on("reconnect_attempt", () => store().setConnection("reconnecting"));
    client.on("connect_error", (error) => {
      // A refused handshake is final (signed out, not on the team); a network error is retried by socket.io.
      if (!client.active) store().setConnection("refused", error.message);
      else store().setConnection("reconnecting");
    });
    return () => {
      client.removeAllListeners();
      client.disconnect();
      useSessionStore.getState().reset(null);
    };
  }, [projectId, realtimeUrl, queryClient]);

  return useSessionStore((s) => s.socket);
}
