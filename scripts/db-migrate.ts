// Applies the committed drizzle-kit migrations in ./drizzle to DATABASE_URL (run by `npm start` and `npm test`,
// with --conditions=react-server since the backfills are commands), then gives analysis runs stored before
// migration 0006 their result columns and revisions saved before migration 0019 their viewer geometry.
import path from "node:path";
import { fileURLToPath } from "node:url";
import { migrate } from "drizzle-orm/node-postgres/migrator";
import { closeDb, getDb } from "../db/client";
import { backfillResultColumns } from "../lib/commands/backfill-result-columns";
import { backfillRevisionGeometry } from "../lib/commands/backfill-revision-geometry";
import { installQueues } from "../lib/jobs/queue";

const root = path.resolve(path.dirname(fileURLToPath(import.meta.url)), "..");

async function main() {
  await migrate(getDb(), { migrationsFolder: path.join(root, "drizzle") });
  await installQueues(process.env.DATABASE_URL!);
  const filled = await backfillResultColumns();
  if (filled > 0) console.log(`[migrate] stored the result columns of ${filled} earlier analysis run${filled === 1 ? "" : "s"}`);
  const packed = await backfillRevisionGeometry();
  if (packed > 0) console.log(`[migrate] stored the viewer geometry of ${packed} earlier revision${packed === 1 ? "" : "s"}`);
  console.log("[migrate] database schema and job queues are up to date");
}

main()
  .catch((error) => {
    console.error(`[migrate] failed: ${error instanceof Error ? error.message : error}`);
    process.exitCode = 1;
  })
  .finally(closeDb);
