import "server-only";
import { and, desc, eq, gt, inArray, lt } from "drizzle-orm";
import { db } from "@/db/client";
import { authAttempts } from "@/db/schema";
import { AppError } from "@/lib/errors";
import { describeWait, limitKey, LIMITS, retryAt, type LimitRule } from "@/lib/auth/rate-limit-rules";

/**
 * Abuse limits kept in PostgreSQL (table auth_attempts), so every server behind a load balancer
 * counts the same attempts.
 */

export interface Limited {
  retryAt: Date;
  message: string;
}

async function countedAttempts(rule: LimitRule, key: string, now: Date): Promise<Date[]> {
  const since = new Date(now.getTime() - rule.windowMs);
  const conditions = [eq(authAttempts.key, key), gt(authAttempts.createdAt, since)];
  // A success does not clear earlier failures: an attacker who also knows one account's password
  // (their own) must not be able to reset the per-address count with it.
  if (rule.counts === "failures") conditions.push(eq(authAttempts.succeeded, false));
  const rows = await db()
    .select({ createdAt: authAttempts.createdAt })
    .from(authAttempts)
    .where(and(...conditions))
    .orderBy(desc(authAttempts.createdAt))
    .limit(rule.max);
  return rows.map((r) => r.createdAt);
}

/** The latest moment among the rules that block, or null when every rule allows an attempt now. */
export async function checkLimits(checks: Array<[LimitRule, string]>, what: string): Promise<Limited | null> {
  const now = new Date();
  let worst: Date | null = null;
  for (const [rule, subject] of checks) {
    const at = retryAt(rule, await countedAttempts(rule, limitKey(rule, subject), now), now);
    if (at && (!worst || at > worst)) worst = at;
  }
  if (!worst) return null;
  return {
    retryAt: worst,
    message: `Too many ${what}. Try again ${describeWait(worst, now)} (after ${worst.toISOString().slice(11, 16)} UTC).`,
  };
}

/**
 * Counts an attempt before it is made (before the slow password comparison), so parallel
 * attempts cannot all pass one check: the rows are written first as failures, then counted with
 * everything written before them. Blocked, the rows are taken back and the wait returned; let
 * through, the ids come back for `markAttemptSucceeded` once the outcome is known.
 */
export async function consumeAttempt(checks: Array<[LimitRule, string]>, what: string): Promise<{ limited: Limited } | { ids: string[] }> {
  const rows = await db()
    .insert(authAttempts)
    .values(checks.map(([rule, subject]) => ({ key: limitKey(rule, subject), succeeded: false })))
    .returning({ id: authAttempts.id });
  const ids = rows.map((r) => r.id);
  const now = new Date();
  let over = false;
  for (const [rule, subject] of checks) {
    const counted = await countedAttempts({ ...rule, max: rule.max + 1 }, limitKey(rule, subject), now);
    if (counted.length > rule.max) over = true;
  }
  if (!over) return { ids };
  await db().delete(authAttempts).where(inArray(authAttempts.id, ids));
  const limited = await checkLimits(checks, what);
  return { limited: limited ?? { retryAt: new Date(now.getTime() + 60_000), message: `Too many ${what}. Try again in 1 minute.` } };
}

export async function markAttemptSucceeded(ids: string[]): Promise<void> {
  if (ids.length) await db().update(authAttempts).set({ succeeded: true }).where(inArray(authAttempts.id, ids));
}

export async function recordAttempt(checks: Array<[LimitRule, string]>, succeeded: boolean): Promise<void> {
  await db()
    .insert(authAttempts)
    .values(checks.map(([rule, subject]) => ({ key: limitKey(rule, subject), succeeded })));
}

export function rateLimitError(limited: Limited, code = "rate_limited:sign_in"): AppError {
  const seconds = Math.max(1, Math.ceil((limited.retryAt.getTime() - Date.now()) / 1000));
  return new AppError(code as `rate_limited:${string}`, limited.message, {
    headers: { "Retry-After": String(seconds) },
    details: { retryAt: limited.retryAt.toISOString() },
  });
}

export const signInChecks = (email: string, address: string): Array<[LimitRule, string]> => [
  [LIMITS.signInAccount, email],
  [LIMITS.signInAddress, address],
];

export const resetChecks = (email: string, address: string): Array<[LimitRule, string]> => [
  [LIMITS.resetAccount, email],
  [LIMITS.resetAddress, address],
];

/** Old rows serve no limit; pruned opportunistically so the table stays small. */
export async function pruneAttempts(olderThanMs = 24 * 3600_000): Promise<void> {
  await db().delete(authAttempts).where(lt(authAttempts.createdAt, new Date(Date.now() - olderThanMs)));
}

