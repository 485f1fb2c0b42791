import { drizzle, type NodePgDatabase } from "drizzle-orm/node-postgres";
import { Pool } from "pg";
import { config } from "@/lib/config";
import * as schema from "./schema";

export type Db = NodePgDatabase<typeof schema>;
/** An open transaction; data-access functions that take one run inside the caller's transaction. */
export type Tx = Parameters<Parameters<Db["transaction"]>[0]>[0];
/** The database or an open transaction: what a data-access function reads and writes through. */
export type Executor = Db | Tx;

const globalForDb = globalThis as unknown as { ondulaPool?: Pool; ondulaDb?: Db };

/** One pool per process. The error listeners keep a database restart from crashing the server. */
export function pool(): Pool {
  if (!globalForDb.ondulaPool) {
    const p = new Pool({
      connectionString: config().DATABASE_URL,
      max: 10,
      connectionTimeoutMillis: 5_000,
      idleTimeoutMillis: 30_000,
    });
    p.on("error", (err) => console.error("[db] idle client error:", err.message));
    // A client lent out to a request has no pool listener: when the server ends its connection
    // (a restart) between two of the request's queries, the error would be thrown uncaught. The
    // request's next query fails instead, and is answered 503 (lib/http/errors.ts).
    p.on("connect", (client) => client.on("error", (err) => console.error("[db] client error:", err.message)));
    globalForDb.ondulaPool = p;
  }
  return globalForDb.ondulaPool;
}

export function db(): Db {
  globalForDb.ondulaDb ??= drizzle(pool(), { schema });
  return globalForDb.ondulaDb;
}

export async function closeDb(): Promise<void> {
  const p = globalForDb.ondulaPool;
  globalForDb.ondulaPool = undefined;
  globalForDb.ondulaDb = undefined;
  await p?.end();
}

/** Runs `fn` in one transaction: everything it writes is kept together or not at all. */
export function transaction<T>(fn: (tx: Tx) => Promise<T>): Promise<T> {
  return db().transaction(fn);
}
