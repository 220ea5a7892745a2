import { sql } from "drizzle-orm";
import { getDb } from "../client";

/** One round trip to PostgreSQL: resolves when the database answers. */
export async function pingDatabase(): Promise<void> {
  await getDb().execute(sql`select 1`);
}
