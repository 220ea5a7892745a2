// A worker thread of `npm run bench:realtime`: runs its share of the simulated members (socket.io clients), so the
// clients' own CPU is spread over threads and measured apart from the servers'. Send times live in shared memory
// (microseconds since the bench's origin, written by the sending thread, read by every receiving thread), so a
// delivery's latency is measured whichever thread sent it. Plain JavaScript: a worker thread gets no TypeScript loader.
import { parentPort, workerData } from "node:worker_threads";
import { io } from "socket.io-client";

const { clients: mine, projectId, pinId, cursorHz, commentEveryS, durationS, drainMs, drainMaxMs, originMs, shared, maxSeq, maxComments, userIndex } = workerData;
const cursorSent = new Int32Array(shared.cursorSent);
const commentSent = new Int32Array(shared.commentSent);
// Per receiver index × clients + sender index: the newest sequence number received, and how many moves arrived
// newer than the one before (a repeat of a place already known, as a resting cursor's, is not counted again).
const highest = new Int32Array(shared.highest);
const received = new Int32Array(shared.received);
const clientCount = Object.keys(userIndex).length;

const nowUs = () => Math.round((performance.timeOrigin + performance.now() - originMs) * 1000);

/** Comment ids carry their sender and number (a valid version-4 UUID), so any thread finds the send time. */
function commentId(slot) {
  return `00000000-0000-4000-8000-${slot.toString(16).padStart(12, "0")}`;
}

const cursorLatencies = [];
const commentLatencies = [];
const stats = { commentsSent: 0, commentsAcked: 0, commentErrors: 0, commentEventsReceived: 0 };
const cursorsSent = {}; // sender index -> moves sent

const sockets = await Promise.all(
  mine.map(async ({ url, token, index }) => {
    const socket = io(url, {
      auth: { projectId },
      transports: ["websocket"],
      extraHeaders: { cookie: `next-auth.session-token=${token}` },
      reconnection: false,
      forceNew: true,
    });
    await new Promise((resolve, reject) => {
      socket.once("welcome", resolve);
      socket.once("connect_error", reject);
    });
    socket.on("cursors", (moves) => {
      const now = nowUs();
      for (const { userId, seq } of moves) {
        const sender = userIndex[userId];
        if (sender === index || sender === undefined) continue;
        const pair = index * clientCount + sender;
        if (seq <= highest[pair]) continue;
        const sent = seq < maxSeq ? Atomics.load(cursorSent, sender * maxSeq + seq) : 0;
        if (sent > 0) cursorLatencies.push((now - sent) / 1000);
        highest[pair] = seq;
        received[pair] += 1;
      }
    });
    socket.on("comment:created", (comment) => {
      stats.commentEventsReceived += 1;
      const sent = Atomics.load(commentSent, parseInt(comment.id.slice(24), 16));
      if (sent > 0) commentLatencies.push((nowUs() - sent) / 1000);
    });
    return { socket, index };
  }),
);
parentPort.postMessage({ type: "connected" });

const timers = [];
/** Each client's last cursor move, sent once more reliably when the run stops (a pointer coming to rest). */
const lastMoves = [];
function run() {
  for (const { socket, index } of sockets) {
    let seq = 0;
    let comments = 0;
    cursorsSent[index] = 0;
    // Spread the clients' phases so the load is even, as it would be with real people.
    const start = setTimeout(() => {
      // Moves go out volatile, as a browser's would: one its connection is not ready for is dropped by socket.io
      // (the next supersedes it); the resting move at the end is sent reliably.
      if (cursorHz > 0) {
        timers.push(
          setInterval(() => {
            if (seq + 1 >= maxSeq) return;
            seq += 1;
            Atomics.store(cursorSent, index * maxSeq + seq, nowUs());
            cursorsSent[index] = seq;
            const move = { point: [Math.random() * 36, Math.random() * 24, 9], seq };
            lastMoves[index] = { socket, move };
            socket.volatile.emit("cursor:move", move);
          }, 1000 / cursorHz),
        );
      }
      if (commentEveryS <= 0) return;
      timers.push(
        setInterval(() => {
          if (comments >= maxComments) return;
          const slot = index * maxComments + comments;
          comments += 1;
          stats.commentsSent += 1;
          Atomics.store(commentSent, slot, nowUs());
          socket
            .timeout(durationS * 1000 + drainMaxMs)
            .emitWithAck("comment:create", { id: commentId(slot), pinId, body: `Bench comment ${slot}` })
            .then(
              (ack) => (ack.ok ? (stats.commentsAcked += 1) : (stats.commentErrors += 1)),
              () => (stats.commentErrors += 1),
            );
        }, commentEveryS * 1000 * (0.8 + Math.random() * 0.4)),
      );
    }, Math.random() * 1000);
    timers.push(start);
  }
}

parentPort.on("message", async (message) => {
  if (message === "go") {
    run();
    await new Promise((r) => setTimeout(r, durationS * 1000));
    for (const timer of timers) clearInterval(timer);
    for (const { socket, move } of lastMoves.filter(Boolean)) socket.emit("cursor:move", move);
    // The drain lasts until every comment is answered (up to drainMaxMs), so a backlog is measured, not cut off.
    const drainStart = performance.now();
    await new Promise((r) => setTimeout(r, drainMs));
    while (stats.commentsAcked + stats.commentErrors < stats.commentsSent && performance.now() - drainStart < drainMaxMs) await new Promise((r) => setTimeout(r, 100));
    // Then until the other nodes' fan-out of those comments has come in (nothing new for a second).
    for (let heard = -1; heard !== stats.commentEventsReceived && performance.now() - drainStart < drainMaxMs; ) {
      heard = stats.commentEventsReceived;
      await new Promise((r) => setTimeout(r, 1000));
    }
    const cursors = Float64Array.from(cursorLatencies);
    const commentsMs = Float64Array.from(commentLatencies);
    parentPort.postMessage({ type: "results", cursorLatencies: cursors, commentLatencies: commentsMs, cursorsSent, ...stats }, [cursors.buffer, commentsMs.buffer]);
  } else if (message === "close") {
    for (const { socket } of sockets) socket.disconnect();
    parentPort.close();
  }
});
