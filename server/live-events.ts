// The realtime end of the event bus: commands write live events in their transaction and NOTIFY on commit; this
// listens, then publishes every unpublished row (so a missed notification or a restart loses nothing, and a
// rolled-back command, which leaves no row, publishes nothing). Team changes are applied to open connections.
import { Client } from "pg";
import { getDb } from "@/db/client";
import { getMembership } from "@/db/queries/memberships";
import { lockUnpublishedLiveEvents, markLiveEventsPublished } from "@/db/queries/live-events";
import type { LiveEventRow } from "@/db/schema";
import { abilitiesOf } from "@/lib/permissions";
import { LIVE_EVENTS_CHANNEL } from "@/lib/realtime/live-events";
import { tellOtherNodes } from "./cluster";
import { projectRoom, type RealtimeServer } from "./context";

const BATCH = 200;
// Safety net for a notification lost while the listening connection was being re-opened.
const SWEEP_EVERY_MS = 5_000;
const RELISTEN_AFTER_MS = 1_000;

type Yjs = { closeConnectionsOf(projectId: string, userId: string, change: { removed: boolean }): void };

/** Re-reads the member's place on the team and applies it to each of their open connections on this project. */
async function applyTeamChange(io: RealtimeServer, yjs: Yjs, projectId: string, userId: string) {
  const membership = await getMembership({ projectId, userId });
  const sockets = [...io.of("/").sockets.values()].filter((s) => s.data.projectId === projectId && s.data.user?.id === userId);
  for (const socket of sockets) {
    if (!membership) {
      socket.emit("access:revoked", { message: "You are no longer on this project's team." });
      socket.disconnect(true);
    } else {
      socket.data.role = membership.role;
      socket.emit("access:changed", { user: { id: userId, name: socket.data.user.name, role: membership.role }, abilities: abilitiesOf(membership.role) });
    }
  }
  // The shared notes connection decides read or write when it opens: closing it makes the client reconnect under
  // the new role (or be refused once removed).
  yjs.closeConnectionsOf(projectId, userId, { removed: !membership });
}

/**
 * Starts listening; stop() ends the listener and waits for a running publish. Every node listens, and each event
 * is published by whichever node locks it first (the room's emit reaches the sockets on every node). A team
 * change is applied by that node to its own connections and, with several nodes, sent to the others to apply to
 * theirs (only the node holding a connection can close it or change what it may do).
 */
export function startLiveEventPublisher({ io, yjs, connectionString }: { io: RealtimeServer; yjs: Yjs; connectionString: string }) {
  io.on("team:changed", ({ projectId, userId }) => {
    applyTeamChange(io, yjs, projectId, userId).catch((error) => console.error("[realtime] applying a team change failed", error));
  });

  async function publish(event: LiveEventRow) {
    if (event.kind === "member") {
      await applyTeamChange(io, yjs, event.projectId, event.subjectId);
      tellOtherNodes(io, "team:changed", { projectId: event.projectId, userId: event.subjectId });
    }
    io.to(projectRoom(event.projectId)).emit("live:invalidate", { kind: event.kind, id: event.subjectId, revision: event.revision });
  }

  let stopped = false;
  let running: Promise<void> | null = null;
  let again = false;
  let listener: Client | null = null;

  async function drainOnce(): Promise<number> {
    return getDb().transaction(async (tx) => {
      const events = await lockUnpublishedLiveEvents({ db: tx, limit: BATCH });
      for (const event of events) await publish(event);
      await markLiveEventsPublished({ db: tx, ids: events.map((e) => e.id) });
      return events.length;
    });
  }

  /** Publishes until nothing is left; a call while one runs makes it go round once more. */
  function drain(): Promise<void> {
    if (running) {
      again = true;
      return running;
    }
    running = (async () => {
      do {
        again = false;
        while (!stopped && (await drainOnce()) === BATCH);
      } while (again && !stopped);
    })()
      .catch((error) => console.error("[realtime] publishing live events failed", error))
      .finally(() => (running = null));
    return running;
  }

  async function listen() {
    if (stopped) return;
    const client = new Client({ connectionString });
    listener = client;
    const relisten = () => {
      if (listener !== client || stopped) return;
      listener = null;
      void client.end().catch(() => undefined);
      setTimeout(() => void listen(), RELISTEN_AFTER_MS).unref();
    };
    client.on("error", (error) => {
      console.error("[realtime] live events listener lost", error.message);
      relisten();
    });
    client.on("end", relisten);
    client.on("notification", () => void drain());
    try {
      await client.connect();
      await client.query(`LISTEN ${LIVE_EVENTS_CHANNEL}`);
      // Whatever was written while nobody listened (the server was down, or the connection was being re-opened).
      void drain();
    } catch (error) {
      console.error("[realtime] could not listen for live events", error);
      relisten();
    }
  }

  void listen();
  const sweep = setInterval(() => void drain(), SWEEP_EVERY_MS);
  sweep.unref();

  return {
    async stop() {
      stopped = true;
      clearInterval(sweep);
      const client = listener;
      listener = null;
      await client?.end().catch(() => undefined);
      await running;
    },
  };
}
