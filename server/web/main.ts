// Entry of the web process (Next.js's documented custom server, started by scripts/stack/services.mjs): the same
// production Next app `next start` serves, on a Node HTTP server of our own so that the answers Next and Node's
// parser give without a body (405, 431, an unknown /api address, a server action that does not exist) carry the
// API's `{ error }` shape (server/web/answers.ts), and the header limit is the one stated in lib/limits.ts.
import { createServer } from "node:http";
import next from "next";
import { headerBytes } from "../../lib/limits";
import { answerClientError, answerRefusalsInJson } from "./answers";

// Loopback only, like every process of the stack; the port is the first argument (scripts/stack/services.mjs).
const hostname = "127.0.0.1";
const port = Number(process.argv[2]);
if (!Number.isInteger(port) || port <= 0) throw new Error("Usage: tsx server/web/main.ts <port>");
const app = next({ dev: false, dir: process.cwd(), hostname, port });
const handle = app.getRequestHandler();
await app.prepare();

const server = createServer({ maxHeaderSize: headerBytes }, (request, response) => {
  answerRefusalsInJson(request, response);
  void handle(request, response);
});
server.on("clientError", answerClientError);
server.listen(port, hostname, () => console.log(`[web] listening on http://${hostname}:${port}`));

let stopping = false;
function stop(signal: string) {
  if (stopping) return;
  stopping = true;
  console.log(`[web] ${signal}: stopping`);
  server.close(() => process.exit(0));
  // Open keep-alive connections would hold close() back; requests under way get a moment to finish.
  setTimeout(() => process.exit(0), 5_000).unref();
  server.closeIdleConnections();
}
process.on("SIGTERM", () => stop("SIGTERM"));
process.on("SIGINT", () => stop("SIGINT"));
