// The jobs process's health endpoint (GET /health on JOBS_PORT, loopback): it serves nothing else, so a small HTTP
// server of its own answers the supervisor and operators the same way web (/api/health) and realtime (/health) do.
import { createServer, type Server } from "node:http";
import { pingDatabase } from "../../db/queries/health";
import { checkHealth } from "../../lib/health";

export function serveHealth(port: number): Promise<Server> {
  const server = createServer((request, response) => {
    const json = (status: number, body: unknown) => response.writeHead(status, { "content-type": "application/json", "cache-control": "no-store" }).end(JSON.stringify(body));
    if (request.method === "GET" && request.url === "/health") {
      void checkHealth("jobs", pingDatabase).then(({ status, body }) => json(status, body));
      return;
    }
    json(404, { error: "Not found: the jobs process answers GET /health only." });
  });
  return new Promise((resolve, reject) => {
    server.once("error", reject);
    server.listen(port, "127.0.0.1", () => resolve(server));
  });
}
