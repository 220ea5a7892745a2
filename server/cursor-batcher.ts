// Cursor moves are many and small: fanning each one out as its own frame costs (members x moves) frames a second.
// They are gathered per room and sent every flushMs as one batch (every move kept, in order, so receivers can
// check sequence numbers); each receiver skips its own. The buffer lives for one flush only.
import type { CursorMove } from "@/lib/realtime/events";
import { projectRoom, type RealtimeServer } from "./context";

export const cursorBatchConfig = { flushMs: 40 } as const;

/** A per-room buffer of cursor moves, flushed to the room every cursorBatchConfig.flushMs. */
export function createCursorBatcher(io: RealtimeServer) {
  const pending = new Map<string, CursorMove[]>();
  let timer: NodeJS.Timeout | null = null;

  function flush() {
    timer = null;
    for (const [projectId, moves] of pending) io.to(projectRoom(projectId)).emit("cursors", moves);
    pending.clear();
  }

  return {
    /** Queues one move for the project's room. */
    add(projectId: string, move: CursorMove) {
      const moves = pending.get(projectId);
      if (moves) moves.push(move);
      else pending.set(projectId, [move]);
      timer ??= setTimeout(flush, cursorBatchConfig.flushMs);
    },
    /** Sends what is queued now and stops the timer (shutdown). */
    close() {
      if (timer) clearTimeout(timer);
      flush();
    },
  };
}

export type CursorBatcher = ReturnType<typeof createCursorBatcher>;
