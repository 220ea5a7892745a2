// A jobs process holds the event loop for seconds in a big analysis; a transaction of another task in the same
// process (the mail outbox) can then sit idle past idle_in_transaction_session_timeout, and PostgreSQL ends its
// session. That transaction must fail and the process live on: with 120 x 120 roofs it used to end the jobs process.
import { sql } from "drizzle-orm";
import { Pool } from "pg";
import { afterAll, describe, expect, it } from "vitest";
import { closeDb, getDb, requireIntegrationEnv } from "../support/db";

requireIntegrationEnv();
const admin = new Pool({ connectionString: process.env.DATABASE_URL, max: 1 });
afterAll(async () => {
  await admin.end();
  await closeDb();
});

describe("a database session ended by the server while a transaction holds it", () => {
  it("fails that transaction with the server's reason, and the pool serves the next request", async () => {
    const transaction = getDb().transaction(async (tx) => {
      const { rows } = await tx.execute<{ pid: number }>(sql`select pg_backend_pid() as pid`);
      await admin.query("select pg_terminate_backend($1)", [rows[0].pid]);
      // The server's notice of the ended session arrives while this transaction is idle, as in the jobs process.
      await new Promise((resolve) => setTimeout(resolve, 500));
      await tx.execute(sql`select 1`);
    });
    await expect(transaction).rejects.toThrow();
    const { rows } = await getDb().execute<{ one: number }>(sql`select 1 as one`);
    expect(rows[0].one).toBe(1);
  });
});
