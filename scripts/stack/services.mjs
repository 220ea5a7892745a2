// The product's processes (design.md, "Processes"), started the same way by `npm start` and by the tests.
// "backing" services are the local fakes of hosted services; "app" services are Strutroom's own processes.
import { startProcess } from "./processes.mjs";
import { waitForPort } from "./ports.mjs";

const bin = (name) => `node_modules/.bin/${name}`;

const SERVICES = [
  {
    name: "web",
    kind: "app",
    port: (ports) => ports.web,
    command: (ports) => [bin("next"), ["start", "-H", "127.0.0.1", "-p", String(ports.web)]],
  },
];

/** Starts the services of the given kinds on loopback; resolves when each one accepts connections. */
export async function startServices({ env, ports, kinds = ["backing", "app"], quiet = false }) {
  for (const kind of kinds) {
    const group = SERVICES.filter((service) => service.kind === kind);
    for (const service of group) {
      const [command, args] = service.command(ports);
      startProcess(service.name, command, args, { env, quiet });
    }
    await Promise.all(group.map((service) => waitForPort(service.port(ports), `The ${service.name} service`, 120_000)));
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
    S3_PORT: String(ports.s3),
    SMTP_PORT: String(ports.smtp),
    STRUTROOM_DATA_DIR: dataDir,
  };
}
