// The product's processes (design.md, "Processes"), started the same way by `npm start` and by the tests.
// "backing" services are the local fakes of hosted services; "app" services are Strutroom's own processes.
import { mkdirSync } from "node:fs";
import path from "node:path";
import { startProcess } from "./processes.mjs";
import { waitForPort } from "./ports.mjs";

const bin = (name) => `node_modules/.bin/${name}`;

const SERVICES = [
  {
    name: "s3",
    kind: "backing",
    port: (ports) => ports.s3,
    command: () => [process.execPath, ["scripts/fakes/s3.mjs"]],
  },
  {
    name: "smtp",
    kind: "backing",
    port: (ports) => ports.smtp,
    command: () => [process.execPath, ["scripts/fakes/smtp.mjs"]],
  },
  {
    // The production Next app on our own HTTP server (server/web/main.ts): refusals Next and Node answer without a
    // body (405, 431, unknown /api addresses) get the API's JSON error shape.
    name: "web",
    kind: "app",
    port: (ports) => ports.web,
    command: (ports) => [bin("tsx"), ["server/web/main.ts", String(ports.web)]],
  },
  {
    // socket.io + Yjs (server/index.ts). The react-server condition lets it import the "server-only" data layer.
    name: "realtime",
    kind: "app",
    port: (ports) => ports.realtime,
    command: () => [bin("tsx"), ["--conditions=react-server", "server/index.ts"]],
  },
  {
    // Analysis queue, mail outbox, upload sweep and daily digest (server/jobs/main.ts). Its port carries only
    // GET /health, opened once the queues are served; a crash is logged and restarted by processes.mjs.
    name: "jobs",
    kind: "app",
    port: (ports) => ports.jobs,
    command: () => [bin("tsx"), ["--conditions=react-server", "server/jobs/main.ts"]],
  },
];

/**
 * Starts the services of the given kinds on loopback; resolves when each one accepts connections. `node` ("1",
 * "2"…) names the processes of one node of a cluster run (web-1, realtime-1, jobs-1), each with its own pid file.
 */
export async function startServices({ env, ports, kinds = ["backing", "app"], quiet = false, node = "" }) {
  // Each service's current process id, for operators and for the test that kills web and realtime.
  const pids = path.join(env.STRUTROOM_DATA_DIR, "pids");
  mkdirSync(pids, { recursive: true });
  for (const kind of kinds) {
    const group = SERVICES.filter((service) => service.kind === kind);
    for (const service of group) {
      const [command, args] = service.command(ports);
      // A crash of one process never leaves the site down: every service is restarted with back-off.
      const name = node ? `${service.name}-${node}` : service.name;
      startProcess(name, command, args, { env, quiet, restart: true, pidFile: path.join(pids, `${name}.pid`) });
    }
    const listening = group.filter((service) => service.port);
    await Promise.all(listening.map((service) => waitForPort(service.port(ports), `The ${service.name} service`, 120_000)));
  }
}

/** The environment every process shares, from the database URL, ports and secret. */
export function serviceEnv({ databaseUrl, ports, secret, dataDir }) {
  return {
    ...process.env,
    NODE_ENV: "production",
    DATABASE_URL: databaseUrl,
    NEXTAUTH_URL: `http://127.0.0.1:${ports.web}`,
    NEXTAUTH_SECRET: secret,
    APP_URL: `http://127.0.0.1:${ports.web}`,
    REALTIME_PORT: String(ports.realtime),
    REALTIME_URL: `http://127.0.0.1:${ports.realtime}`,
    JOBS_PORT: String(ports.jobs),
    S3_PORT: String(ports.s3),
    SMTP_PORT: String(ports.smtp),
    // Object storage and mail: the local fakes above; a hosted deployment sets these to the real services.
    S3_ENDPOINT: `http://127.0.0.1:${ports.s3}`,
    S3_REGION: "us-east-1",
    S3_BUCKET: "strutroom",
    S3_ACCESS_KEY_ID: "S3RVER",
    S3_SECRET_ACCESS_KEY: "S3RVER",
    SMTP_HOST: "127.0.0.1",
    MAIL_FROM: "Strutroom <no-reply@strutroom.test>",
    // Says the SMTP server is the local capturing fake, which enables the owners' captured-mail page.
    MAIL_CAPTURE_LOCAL: "1",
    STRUTROOM_DATA_DIR: dataDir,
  };
}
