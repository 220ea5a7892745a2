// A worker thread of `npm run bench:realtime`: runs its share of the simulated members (socket.io clients), so the
// clients' own CPU is spread over threads and measured apart from the servers'. Send times live in shared memory
// (microseconds since the bench's origin, written by the sending thread, read by every receiving thread), so a
// delivery's latency is measured whichever thread sent it. Plain JavaScript: a worker thread gets no TypeScript loader.
import { parentPort, workerData } from "node:worker_threads";
import { io } from "socket.io-client";

const { clients: mine, projectId, pinId, cursorHz, commentEveryS, durationS, drainMs, originMs, shared, maxSeq, maxComments, userIndex } = workerData;
const cursorSent = new Int32Array(shared.cursorSent);
const commentSent = new Int32Array(shared.commentSent);
const received = new Int32Array(shared.received); // receiver index × clients + sender index
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
        const sent = seq < maxSeq ? Atomics.load(cursorSent, sender * maxSeq + seq) : 0;
        if (sent > 0) cursorLatencies.push((now - sent) / 1000);
        received[index * clientCount + sender] += 1;
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
function run() {
  for (const { socket, index } of sockets) {
    let seq = 0;
    let comments = 0;
    cursorsSent[index] = 0;
    // Spread the clients' phases so the load is even, as it would be with real people.
    const start = setTimeout(() => {
      timers.push(
        setInterval(() => {
          if (seq + 1 >= maxSeq) return;
          seq += 1;
          Atomics.store(cursorSent, index * maxSeq + seq, nowUs());
          cursorsSent[index] = seq;
          socket.emit("cursor:move", { point: [Math.random() * 36, Math.random() * 24, 9], seq });
        }, 1000 / cursorHz),
      );
      timers.push(
        setInterval(() => {
          if (comments >= maxComments) return;
          const slot = index * maxComments + comments;
          comments += 1;
          stats.commentsSent += 1;
          Atomics.store(commentSent, slot, nowUs());
          socket
            .timeout(durationS * 1000 + drainMs)
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
    await new Promise((r) => setTimeout(r, drainMs));
    const cursors = Float64Array.from(cursorLatencies);
    const commentsMs = Float64Array.from(commentLatencies);
    parentPort.postMessage({ type: "results", cursorLatencies: cursors, commentLatencies: commentsMs, cursorsSent, ...stats }, [cursors.buffer, commentsMs.buffer]);
  } else if (message === "close") {
    for (const { socket } of sockets) socket.disconnect();
    parentPort.close();
  }
});
