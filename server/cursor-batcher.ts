// Cursor moves are many and small, and only the newest place of a cursor matters. Each frame (flushMs) the room gets
// one batch holding each moving cursor's newest move (older moves of the frame are superseded, not sent), sent
// volatile: a receiver whose connection is still busy writing skips the batch instead of queueing stale places (the
// next frame supersedes it). A cursor that stopped would then be left wherever the last batch that reached a
// receiver put it, so one frame after a cursor's last move its place is sent once more, reliably ("resting"). Each
// receiver skips its own moves; sequence numbers only grow, so receivers can tell a newer place from an older one.
import type { CursorMove } from "@/lib/realtime/events";
import { projectRoom, type RealtimeServer } from "./context";

export const cursorBatchConfig = { flushMs: 40 } as const;

type RoomCursors = {
  /** Each cursor's newest move in the frame now filling, by socket. */
  fresh: Map<string, CursorMove>;
  /** The moves sent volatile in the last frame: a cursor among them with no fresh move has stopped. */
  sent: Map<string, CursorMove>;
};

/** Per-room cursor frames, flushed every cursorBatchConfig.flushMs while any cursor moves or has just stopped. */
export function createCursorBatcher(io: RealtimeServer) {
  const rooms = new Map<string, RoomCursors>();
  let timer: NodeJS.Timeout | null = null;

  function flush() {
    timer = null;
    for (const [projectId, room] of rooms) {
      const resting = [...room.sent].filter(([socketId]) => !room.fresh.has(socketId)).map(([, move]) => move);
      if (room.fresh.size > 0) io.volatile.to(projectRoom(projectId)).emit("cursors", [...room.fresh.values()]);
      if (resting.length > 0) io.to(projectRoom(projectId)).emit("cursors", resting);
      if (room.fresh.size === 0) rooms.delete(projectId);
      else rooms.set(projectId, { fresh: new Map(), sent: room.fresh });
    }
    if (rooms.size > 0) timer = setTimeout(flush, cursorBatchConfig.flushMs);
  }

  return {
    /** Takes one move for the project's room; it supersedes the same socket's earlier move of this frame. */
    add(projectId: string, move: CursorMove) {
      const room = rooms.get(projectId);
      if (room) room.fresh.set(move.socketId, move);
      else rooms.set(projectId, { fresh: new Map([[move.socketId, move]]), sent: new Map() });
      timer ??= setTimeout(flush, cursorBatchConfig.flushMs);
    },
    /** Sends the frame filling now, reliably, and stops the timer (shutdown). */
    close() {
      if (timer) clearTimeout(timer);
      timer = null;
      for (const [projectId, room] of rooms) {
        const last = new Map([...room.sent, ...room.fresh]);
        if (last.size > 0) io.to(projectRoom(projectId)).emit("cursors", [...last.values()]);
      }
      rooms.clear();
    },
  };
}

export type CursorBatcher = ReturnType<typeof createCursorBatcher>;
