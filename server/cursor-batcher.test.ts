// Cursor frames: the newest move per cursor per frame, volatile, and a stopped cursor's last place sent once more
// reliably. socket.io's `volatile` flag (documented in its emit cheatsheet: "the message may be lost if the
// underlying connection is not ready") is what the batcher relies on; the fake records which way each batch went.
import { afterEach, beforeEach, describe, expect, it, vi } from "vitest";
import type { CursorMove } from "@/lib/realtime/events";
import type { RealtimeServer } from "./context";
import { createCursorBatcher, cursorBatchConfig } from "./cursor-batcher";

type Sent = { room: string; volatile: boolean; seqs: string[] };

function fakeServer(sent: Sent[]): RealtimeServer {
  const to = (volatile: boolean) => (room: string) => ({
    emit: (_event: string, moves: CursorMove[]) => sent.push({ room, volatile, seqs: moves.map((m) => `${m.socketId}:${m.seq}`) }),
  });
  return { to: to(false), volatile: { to: to(true) } } as unknown as RealtimeServer;
}

const move = (socketId: string, seq: number): CursorMove => ({ userId: `user-${socketId}`, socketId, point: [seq, 0, 9], seq });
const frame = () => vi.advanceTimersByTime(cursorBatchConfig.flushMs);

beforeEach(() => vi.useFakeTimers());
afterEach(() => vi.useRealTimers());

describe("cursor batcher", () => {
  it("sends each cursor's newest move of a frame, volatile, then its resting place once, reliably", () => {
    const sent: Sent[] = [];
    const cursors = createCursorBatcher(fakeServer(sent));
    for (let seq = 1; seq <= 5; seq += 1) cursors.add("p1", move("a", seq));
    frame();
    expect(sent).toEqual([{ room: "project:p1", volatile: true, seqs: ["a:5"] }]);
    frame();
    expect(sent.slice(1)).toEqual([{ room: "project:p1", volatile: false, seqs: ["a:5"] }]);
    frame();
    frame();
    expect(sent).toHaveLength(2);
  });

  it("settles the cursor that stopped while another keeps moving, room by room", () => {
    const sent: Sent[] = [];
    const cursors = createCursorBatcher(fakeServer(sent));
    cursors.add("p1", move("a", 1));
    cursors.add("p1", move("b", 1));
    cursors.add("p2", move("c", 7));
    frame();
    cursors.add("p1", move("a", 2));
    frame();
    expect(sent).toEqual([
      { room: "project:p1", volatile: true, seqs: ["a:1", "b:1"] },
      { room: "project:p2", volatile: true, seqs: ["c:7"] },
      { room: "project:p1", volatile: true, seqs: ["a:2"] },
      { room: "project:p1", volatile: false, seqs: ["b:1"] },
      { room: "project:p2", volatile: false, seqs: ["c:7"] },
    ]);
  });

  it("sends every cursor's last place reliably when closed", () => {
    const sent: Sent[] = [];
    const cursors = createCursorBatcher(fakeServer(sent));
    cursors.add("p1", move("a", 1));
    frame();
    cursors.add("p1", move("b", 3));
    cursors.close();
    frame();
    expect(sent).toEqual([
      { room: "project:p1", volatile: true, seqs: ["a:1"] },
      { room: "project:p1", volatile: false, seqs: ["a:1", "b:3"] },
    ]);
  });
});
