import { and, eq, lt, or, isNull, sql } from "drizzle-orm";
import { db } from "./client";
import { idempotencyKeys } from "./schema";

export interface IdempotencyScope {
  userId: string;
  route: string;
  key: string;
}

export type IdempotencyRow = typeof idempotencyKeys.$inferSelect;

const scopeIs = ({ userId, route, key }: IdempotencyScope) =>
  and(eq(idempotencyKeys.userId, userId), eq(idempotencyKeys.route, route), eq(idempotencyKeys.key, key));

/**
 * Claims a key for one request, in one statement: a new key, or one whose day is over, or one
 * whose first request stopped without an answer (its lease ran out). Answers true when this
 * request holds the key now; false when another has it (then read it with `getIdempotencyKey`).
 */
export async function claimIdempotencyKey({ userId, route, key, fingerprint, leaseMs, ttlMs }: IdempotencyScope & {
  fingerprint: string;
  leaseMs: number;
  ttlMs: number;
}): Promise<boolean> {
  const now = Date.now();
  const fresh = { fingerprint, status: null, body: null, contentType: null, leaseUntil: new Date(now + leaseMs), expiresAt: new Date(now + ttlMs), createdAt: new Date(now) };
  const rows = await db()
    .insert(idempotencyKeys)
    .values({ userId, route, key, ...fresh })
    .onConflictDoUpdate({
      target: [idempotencyKeys.userId, idempotencyKeys.route, idempotencyKeys.key],
      set: fresh,
      setWhere: or(
        lt(idempotencyKeys.expiresAt, sql`now()`),
        and(isNull(idempotencyKeys.status), lt(idempotencyKeys.leaseUntil, sql`now()`)),
      ),
    })
    .returning({ key: idempotencyKeys.key });
  return rows.length === 1;
}

export async function getIdempotencyKey(scope: IdempotencyScope): Promise<IdempotencyRow | null> {
  const [row] = await db().select().from(idempotencyKeys).where(scopeIs(scope));
  return row ?? null;
}

/** Keeps the first answer, for the key's retries. */
export async function saveIdempotentAnswer(scope: IdempotencyScope & { status: number; body: string; contentType: string | null }): Promise<void> {
  await db()
    .update(idempotencyKeys)
    .set({ status: scope.status, body: scope.body, contentType: scope.contentType })
    .where(scopeIs(scope));
}

/** Frees a key whose request created nothing (it failed), so a retry runs again. */
export async function releaseIdempotencyKey(scope: IdempotencyScope): Promise<void> {
  await db().delete(idempotencyKeys).where(and(scopeIs(scope), isNull(idempotencyKeys.status)));
}

export async function deleteExpiredIdempotencyKeys(): Promise<void> {
  await db().delete(idempotencyKeys).where(lt(idempotencyKeys.expiresAt, sql`now()`));
}
