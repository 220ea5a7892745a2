// A real database outage for tests: stops the throwaway cluster scripts/test.mjs started (fast shutdown ends every
// session) and starts it again on the same port with its data.
import { startPostgres, stopPostgres } from "../../scripts/stack/postgres.mjs";

function cluster(): { dataDir: string; port: number } {
  const dataDir = process.env.STRUTROOM_TEST_PG_DIR;
  const url = process.env.DATABASE_URL;
  if (!dataDir || !url) throw new Error("STRUTROOM_TEST_PG_DIR and DATABASE_URL must be set (scripts/test.mjs sets both).");
  return { dataDir, port: Number(new URL(url).port) };
}

export function stopDatabase(): void {
  stopPostgres(cluster().dataDir);
}

export async function startDatabase(): Promise<void> {
  const { dataDir, port } = cluster();
  await startPostgres({ dataDir, port, throwaway: true });
}
