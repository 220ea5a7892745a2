// The setup every realtime integration test file shares: its own project fixture and a fresh realtime server
// before the file's tests, every socket closed and the server stopped after.
import { afterAll, beforeAll } from "vitest";
import { closeDb, requireIntegrationEnv } from "./db";
import { createProjectFixture, type ProjectFixture } from "./fixtures";
import { connectClient, realtimeClient, startRealtimeServer, type ClientSocket, type RealtimeProcess } from "./realtime";

function ready<T>(value: T | undefined, what: string): T {
  if (value === undefined) throw new Error(`${what} is set up in beforeAll; use it inside a test.`);
  return value;
}

/** Registers the file's beforeAll/afterAll; `label` keeps the fixture's e-mails apart from other files'. */
export function realtimeProjectSuite(label: string) {
  let server: RealtimeProcess | undefined;
  let project: ProjectFixture | undefined;
  /** Sockets opened by the file, in order; all are disconnected after its tests. */
  const sockets: ClientSocket[] = [];

  beforeAll(async () => {
    requireIntegrationEnv();
    project = await createProjectFixture(label);
    server = await startRealtimeServer();
  });

  afterAll(async () => {
    for (const socket of sockets) socket.disconnect();
    await server?.stop();
    await closeDb();
  });

  const suite = {
    get server(): RealtimeProcess {
      return ready(server, "The realtime server");
    },
    get project(): ProjectFixture {
      return ready(project, "The project fixture");
    },
    sockets,
    /** A connected socket for the project member with this role. */
    async signedIn(role: keyof ProjectFixture["users"]): Promise<ClientSocket> {
      const socket = await realtimeClient(suite.server.url, suite.project.projectId, suite.project.users[role]);
      sockets.push(socket);
      await connectClient(socket);
      return socket;
    },
  };
  return suite;
}
