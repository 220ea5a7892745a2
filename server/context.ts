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

export type RealtimeServer = Server<ClientToServerEvents, ServerToClientEvents, Record<string, never>, SocketData>;

/** Everyone connected to a project. */
export function projectRoom(projectId: string): string {
  return `project:${projectId}`;
}

/** Every connection of one person (notifications reach all their tabs). */
export function userRoom(userId: string): string {
  return `user:${userId}`;
}
