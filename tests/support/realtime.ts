// The realtime server as a real child process (the same command as scripts/stack/services.mjs), and signed-in
// socket.io and Yjs clients for it.
import { spawn, type ChildProcess } from "node:child_process";
import net from "node:net";
import { io as connect, type Socket } from "socket.io-client";
import WebSocket from "ws";
import { WebsocketProvider } from "y-websocket";
import * as Y from "yjs";
import type { Ack, ClientToServerEvents, ServerToClientEvents } from "@/lib/realtime/events";
import type { ProjectFixture } from "./fixtures";
import { sessionCookie, type Person } from "./session";

export type ClientSocket = Socket<ServerToClientEvents, ClientToServerEvents>;

function freePort(): Promise<number> {
  return new Promise((resolve, reject) => {
    const server = net.createServer();
    server.once("error", reject);
    server.listen(0, "127.0.0.1", () => {
      const { port } = server.address() as net.AddressInfo;
      server.close(() => resolve(port));
    });
  });
}

function portOpen(port: number): Promise<boolean> {
  return new Promise<boolean>((resolve) => {
    const socket = net.connect({ host: "127.0.0.1", port });
    socket.once("connect", () => {
      socket.destroy();
      resolve(true);
    });
    socket.once("error", () => resolve(false));
  });
}

async function waitForPort(port: number, child: ChildProcess, output: () => string) {
  for (let attempt = 0; attempt < 300; attempt += 1) {
    if (child.exitCode !== null) throw new Error(`The realtime server exited early:\n${output()}`);
    if (await portOpen(port)) return;
    await new Promise((r) => setTimeout(r, 100));
  }
  throw new Error(`The realtime server did not listen on ${port}:\n${output()}`);
}

export type RealtimeProcess = { url: string; port: number; appUrl: string; stop: () => Promise<void>; crash: () => Promise<void>; start: () => Promise<void> };

/**
 * Starts server/index.ts on a free port; stop() sends SIGTERM and waits, crash() kills it with SIGKILL (nothing
 * stored on the way out), start() starts it again on the same port. `env` adds to the environment (REDIS_URL makes
 * it one node of several).
 */
export async function startRealtimeServer({ appUrl = "http://127.0.0.1:3999", env = {} }: { appUrl?: string; env?: Record<string, string> } = {}): Promise<RealtimeProcess> {
  const port = await freePort();
  let child: ChildProcess | null = null;
  let output = "";
  const start = async () => {
    output = "";
    child = spawn("node_modules/.bin/tsx", ["--conditions=react-server", "server/index.ts"], {
      env: { ...process.env, NODE_ENV: "production", REALTIME_PORT: String(port), APP_URL: appUrl, ...env },
      stdio: ["ignore", "pipe", "pipe"],
      // Its own process group: tsx runs the server in a child of its own, which a SIGKILL of tsx alone would leave
      // running (and serving the port), so crash() kills the whole group.
      detached: true,
    });
    child.stdout?.on("data", (chunk) => (output += chunk));
    child.stderr?.on("data", (chunk) => (output += chunk));
    await waitForPort(port, child, () => output);
  };
  const end = async (signal: NodeJS.Signals) => {
    const running = child;
    child = null;
    if (!running || running.exitCode !== null) return;
    await new Promise<void>((resolve) => {
      running.once("exit", () => resolve());
      if (signal === "SIGKILL") process.kill(-running.pid!, signal);
      else running.kill(signal);
    });
    // The launcher is gone; wait until its server child has let go of the port too.
    for (let waited = 0; await portOpen(port); waited += 50) {
      if (waited > 10_000) throw new Error(`The realtime server on port ${port} still answers after it was stopped.`);
      await new Promise((r) => setTimeout(r, 50));
    }
  };
  await start();
  return { url: `http://127.0.0.1:${port}`, port, appUrl, start, stop: () => end("SIGTERM"), crash: () => end("SIGKILL") };
}

/** A socket.io client signed in as `user` (or signed out), joining the project's room; not yet connected. */
export async function realtimeClient(url: string, projectId: string, user?: Person, { origin }: { origin?: string } = {}): Promise<ClientSocket> {
  const headers: Record<string, string> = {};
  if (user) headers.cookie = await sessionCookie(user);
  if (origin) headers.origin = origin;
  return connect(url, {
    auth: { projectId },
    transports: ["websocket"],
    extraHeaders: headers,
    autoConnect: false,
    reconnection: false,
    forceNew: true,
  });
}

/** Connects and resolves on the welcome (or rejects with the server's refusal message). */
export function connectClient(socket: ClientSocket): Promise<Parameters<ServerToClientEvents["welcome"]>[0]> {
  return new Promise((resolve, reject) => {
    socket.once("welcome", resolve);
    socket.once("connect_error", reject);
    socket.connect();
  });
}

/** Emits an event and resolves with the server's acknowledgement. */
export function request<T>(socket: ClientSocket, event: keyof ClientToServerEvents, payload: unknown): Promise<Ack<T>> {
  return socket.timeout(10_000).emitWithAck(event as "pin:create", payload) as Promise<Ack<T>>;
}

/** The next event of that name (with an optional condition), or a timeout error naming it. */
export function nextEvent<E extends keyof ServerToClientEvents>(
  socket: ClientSocket,
  event: E,
  where: (...args: Parameters<ServerToClientEvents[E]>) => boolean = () => true,
  timeoutMs = 10_000,
): Promise<Parameters<ServerToClientEvents[E]>[0]> {
  return new Promise((resolve, reject) => {
    const timer = setTimeout(() => {
      socket.off(event, listener as never);
      reject(new Error(`No "${event}" event within ${timeoutMs} ms.`));
    }, timeoutMs);
    const listener = (...args: Parameters<ServerToClientEvents[E]>) => {
      if (!where(...args)) return;
      clearTimeout(timer);
      socket.off(event, listener as never);
      resolve(args[0]);
    };
    socket.on(event, listener as never);
  });
}

/** A Yjs document connected to the project's live document as `user` (ws carries the session cookie). */
export async function yjsClient(url: string, projectId: string, user: Person, doc = new Y.Doc()) {
  const cookie = await sessionCookie(user);
  // y-websocket takes a WebSocket class; this one adds the Cookie header a browser would send.
  class CookieWebSocket extends WebSocket {
    constructor(address: string | URL, protocols?: string | string[]) {
      super(address, protocols, { headers: { cookie } });
    }
  }
  const provider = new WebsocketProvider(url.replace(/^http/, "ws") + "/yjs", projectId, doc, {
    WebSocketPolyfill: CookieWebSocket as unknown as typeof globalThis.WebSocket,
    connect: true,
    // Each test client stands for another machine: no cross-tab BroadcastChannel shortcut inside this process.
    disableBc: true,
  });
  return { doc, provider };
}

/** Resolves once the provider has completed its first sync with the server. */
export function whenSynced(provider: WebsocketProvider, timeoutMs = 10_000): Promise<void> {
  if (provider.synced) return Promise.resolve();
  return new Promise((resolve, reject) => {
    const timer = setTimeout(() => reject(new Error("The Yjs client did not sync.")), timeoutMs);
    const handler = (synced: boolean) => {
      if (!synced) return;
      clearTimeout(timer);
      provider.off("sync", handler);
      resolve();
    };
    provider.on("sync", handler);
  });
}

/** Polls `condition` every 50 ms until it holds; fails naming `what` after `timeoutMs`. */
export async function until(condition: () => boolean | Promise<boolean>, what: string, timeoutMs = 10_000): Promise<void> {
  const end = Date.now() + timeoutMs;
  while (!(await condition())) {
    if (Date.now() > end) throw new Error(`Timed out waiting until ${what}.`);
    await new Promise((r) => setTimeout(r, 50));
  }
}

type Role = keyof ProjectFixture["users"];

/**
 * Signed-in socket.io and Yjs clients of a project on any realtime node (one server or several), remembered so
 * `closeAll` ends every one after the file's tests. `project` is read when a client is opened (it is made in beforeAll).
 */
export function projectClients(project: () => ProjectFixture) {
  const sockets: ClientSocket[] = [];
  const providers: WebsocketProvider[] = [];
  return {
    /** A connected socket for the member with this role, on `node`. */
    async on(node: RealtimeProcess, role: Role, fixture = project()): Promise<ClientSocket> {
      const socket = await realtimeClient(node.url, fixture.projectId, fixture.users[role]);
      sockets.push(socket);
      await connectClient(socket);
      return socket;
    },
    /** The project's live document for the member with this role, on `node`, after its first sync. */
    async notesOn(node: RealtimeProcess, role: Role, doc?: Y.Doc) {
      const fixture = project();
      const client = await yjsClient(node.url, fixture.projectId, fixture.users[role], doc);
      providers.push(client.provider);
      await whenSynced(client.provider);
      return client;
    },
    /** Remembers a provider opened another way, so it is closed with the rest. */
    keep(provider: WebsocketProvider) {
      providers.push(provider);
    },
    closeAll() {
      for (const provider of providers) provider.destroy();
      for (const socket of sockets) socket.disconnect();
    },
  };
}
