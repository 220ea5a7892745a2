"use client";
// Keeps a page's data current while it is open: listens on the project's room for the live invalidations that
// commands publish (server/live-events.ts) and refetches the affected queries. Pages without a live review (the
// clashes page) use this; the live review's own socket does the same among its other work.
import { useQueryClient } from "@tanstack/react-query";
import { useEffect } from "react";
import { io } from "socket.io-client";
import { staleQueryKeys } from "@/components/live/invalidation";
import { SOCKET_PATH, type ClientToServerEvents, type ServerToClientEvents } from "@/lib/realtime/events";
import type { Socket } from "socket.io-client";

export function useLiveInvalidation(projectId: string, realtimeUrl: string): void {
  const queryClient = useQueryClient();
  useEffect(() => {
    const client: Socket<ServerToClientEvents, ClientToServerEvents> = io(realtimeUrl, {
      path: SOCKET_PATH,
      auth: { projectId },
      withCredentials: true,
      transports: ["websocket", "polling"],
      reconnectionDelay: 500,
      reconnectionDelayMax: 10_000,
    });
    client.on("live:invalidate", (invalidation) => {
      for (const queryKey of staleQueryKeys(projectId, invalidation)) void queryClient.invalidateQueries({ queryKey });
    });
    // Whatever changed while the connection was down is refetched once it is back.
    client.io.on("reconnect", () => void queryClient.invalidateQueries({ queryKey: ["projects", projectId] }));
    return () => {
      client.close();
    };
  }, [projectId, realtimeUrl, queryClient]);
}
