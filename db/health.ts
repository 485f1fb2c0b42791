import { sql } from "drizzle-orm";
import { db } from "./client";

export interface DbHealth {
  ok: boolean;
  migration?: { count: number; latest: string | null };
  error?: string;
}

/** Reachability and migration level, for /api/health. */
export async function checkDatabase(): Promise<DbHealth> {
  try {
    const res = await db().execute(
      sql`select count(*)::int as count, max(created_at)::text as latest from drizzle.__drizzle_migrations`,
    );
    const row = res.rows[0] as { count: number; latest: string | null };
    return { ok: true, migration: { count: row.count, latest: row.latest } };
  } catch (err) {
    return { ok: false, error: err instanceof Error ? err.message : String(err) };
  }
}
