// Integration tests use the real, migrated PostgreSQL at DATABASE_URL (scripts/test.mjs starts a throwaway one).
// To run them alone: start a cluster with scripts/stack/postgres.mjs (throwaway: true), run
// `DATABASE_URL=… npx tsx --conditions=react-server scripts/db-migrate.ts`, then `DATABASE_URL=… NEXTAUTH_SECRET=… npx vitest run --project integration`.
import { closeDb, getDb } from "@/db/client";

export { closeDb, getDb };

/** Fails early with a clear message when the integration environment is missing. */
export function requireIntegrationEnv(): void {
  for (const name of ["DATABASE_URL", "NEXTAUTH_SECRET"]) {
    if (!process.env[name]) throw new Error(`${name} must be set for integration tests (see tests/support/db.ts).`);
  }
}
