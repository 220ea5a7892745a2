// What the realtime server keeps about each socket (set at the handshake) and the names of its rooms.
import type { Server } from "socket.io";
import type { SessionUser } from "@/lib/auth/session-cookie";
import type { ClientToServerEvents, ServerToClientEvents } from "@/lib/realtime/events";
import type { Role } from "@/lib/permissions";

export type SocketData = {
  user: SessionUser;
  role: Role;
  projectId: string;
  /** False while the person has stepped out of following the presenter. */
  following: boolean;
};

/** What one realtime node tells the others (through the cluster adapter; see server/cluster.ts). */
export type NodeToNodeEvents = {
  /** A member was removed or their role changed: each node applies it to its own connections. */
  "team:changed": (change: { projectId: string; userId: string }) => void;
  /** A review session started, changed hands or ended: each node forgets its cached presenter. */
  "session:changed": (change: { projectId: string }) => void;
};

export type RealtimeServer = Server<ClientToServerEvents, ServerToClientEvents, NodeToNodeEvents, SocketData>;

/** Everyone connected to a project. */
export function projectRoom(projectId: string): string {
  return `project:${projectId}`;
}

/** Every connection of one person (notifications reach all their tabs). */
export function userRoom(userId: string): string {
  return `user:${userId}`;
}
