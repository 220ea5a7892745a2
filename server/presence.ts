// The presence list of a project room, rebuilt from the sockets themselves (fetchSockets asks every node when a
// shared adapter is used), so no node holds presence that another could not rebuild.
import type { PresenceEntry } from "@/lib/realtime/events";
import { ROLES } from "@/lib/permissions";
import { projectRoom, type RealtimeServer } from "./context";

/** How long to wait for the other nodes' sockets before giving up (a node killed outright never answers). */
const FETCH_TIMEOUT_MS = 2000;

/** Who is in the project's room, one entry per person, owners first. */
export async function presenceOf(io: RealtimeServer, projectId: string, presenterId: string | null): Promise<PresenceEntry[]> {
  const sockets = await io.in(projectRoom(projectId)).timeout(FETCH_TIMEOUT_MS).fetchSockets();
  const byUser = new Map<string, PresenceEntry>();
  for (const { data } of sockets) {
    const entry = byUser.get(data.user.id);
    if (entry) {
      entry.connections += 1;
      entry.following ||= data.following;
    } else {
      byUser.set(data.user.id, {
        id: data.user.id,
        name: data.user.name,
        role: data.role,
        connections: 1,
        following: data.following,
        presenting: data.user.id === presenterId,
      });
    }
  }
  return [...byUser.values()].sort((a, b) => ROLES.indexOf(a.role) - ROLES.indexOf(b.role) || a.name.localeCompare(b.name));
}
