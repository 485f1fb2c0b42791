import { drizzle, type NodePgDatabase } from "drizzle-orm/node-postgres";
import { Pool } from "pg";
import { config } from "@/lib/config";
import * as schema from "./schema";

export type Db = NodePgDatabase<typeof schema>;

const globalForDb = globalThis as unknown as { ondulaPool?: Pool; ondulaDb?: Db };

/** One pool per process. The error listener keeps a database restart from crashing the server. */
export function pool(): Pool {
  if (!globalForDb.ondulaPool) {
    const p = new Pool({
      connectionString: config().DATABASE_URL,
      max: 10,
      connectionTimeoutMillis: 5_000,
      idleTimeoutMillis: 30_000,
    });
    p.on("error", (err) => console.error("[db] idle client error:", err.message));
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
