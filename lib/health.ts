// The answer of every process's health endpoint (web /api/health, realtime /health): up, and whether PostgreSQL
// answers. Process supervisors and the stack test read it.
// The caller passes the database ping (db/queries/health.ts pingDatabase), so this file stays free of db/.

export type Health = { status: number; body: { ok: true; process: string } | { error: string; process: string } };

export async function checkHealth(process: string, pingDatabase: () => Promise<unknown>): Promise<Health> {
  try {
    await pingDatabase();
    return { status: 200, body: { ok: true, process } };
  } catch {
    return { status: 503, body: { error: "The database is not answering; try again in a moment.", process } };
  }
}
