import net from "node:net";

/** True when something already accepts connections on 127.0.0.1:port. */
export function isPortTaken(port) {
  return new Promise((resolve) => {
    const socket = net.connect({ host: "127.0.0.1", port });
    socket.once("connect", () => { socket.destroy(); resolve(true); });
    socket.once("error", () => resolve(false));
  });
}

/** A port the operating system says is free right now. */
export function freePort() {
  return new Promise((resolve, reject) => {
    const server = net.createServer();
    server.once("error", reject);
    server.listen(0, "127.0.0.1", () => {
      const { port } = server.address();
      server.close(() => resolve(port));
    });
  });
}

/** Waits until a TCP port answers, or fails with the service's name after the timeout. */
export async function waitForPort(port, name, timeoutMs = 60_000) {
  const deadline = Date.now() + timeoutMs;
  while (Date.now() < deadline) {
    if (await isPortTaken(port)) return;
    await new Promise((r) => setTimeout(r, 200));
  }
  throw new Error(`${name} did not start listening on 127.0.0.1:${port} within ${timeoutMs / 1000} s.`);
}
