// No "server-only" marker here: scripts (migrate, seed) and the realtime server run this outside Next.js.
import { drizzle, type NodePgDatabase } from "drizzle-orm/node-postgres";
import { Pool } from "pg";
import { database } from "../lib/limits";
import * as schema from "./schema";

export type Database = NodePgDatabase<typeof schema>;
/** A transaction handle; accepted wherever a query function takes `db`. */
export type Transaction = Parameters<Parameters<Database["transaction"]>[0]>[0];
/** Either the database or an open transaction. */
export type Executor = Database | Transaction;

let pool: Pool | undefined;
let db: Database | undefined;

/** The one drizzle instance of this process, created on first use from DATABASE_URL. */
export function getDb(): Database {
  if (!db) {
    const connectionString = process.env.DATABASE_URL;
    if (!connectionString) throw new Error("DATABASE_URL is not set.");
    // No statement runs, and no transaction sits idle, past lib/limits.ts's bounds: one stuck request can never
    // hold locks that every later request waits on.
    const { statementTimeoutMs, idleInTransactionTimeoutMs } = database;
    pool = new Pool({
      connectionString,
      max: Number(process.env.DATABASE_POOL_MAX ?? 10),
      options: `-c statement_timeout=${statementTimeoutMs} -c idle_in_transaction_session_timeout=${idleInTransactionTimeoutMs}`,
    });
    pool.on("error", (error) => console.error("[db] idle client error", error));
    // pg-pool listens for errors only on idle clients. When the server ends a checked-out client's session (the
    // idle-in-transaction bound above, when a long computation holds the event loop; a restarted database), pg
    // emits "error" on it, and with no listener Node ends the whole process. With one, only that transaction fails.
    pool.on("connect", (client) => client.on("error", (error) => console.error("[db] client error", error.message)));
    db = drizzle(pool, { schema, casing: "snake_case" });
  }
  return db;
}

/** The pg pool behind getDb(), for libraries that keep their own table through a pg client (sign-in limits). */
export function getPool(): Pool {
  getDb();
  if (!pool) throw new Error("The database pool is not open.");
  return pool;
}

/** Runs fn in one transaction: everything it writes commits together or not at all. */
export function withTransaction<T>(fn: (tx: Transaction) => Promise<T>): Promise<T> {
  return getDb().transaction(fn);
}

/** Closes the pool (scripts and tests call this before exiting). */
export async function closeDb(): Promise<void> {
  const current = pool;
  pool = undefined;
  db = undefined;
  await current?.end();
}
