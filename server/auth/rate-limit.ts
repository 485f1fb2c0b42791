import "server-only";
import { createHash } from "node:crypto";
import { RateLimiterPostgres, RateLimiterRes } from "rate-limiter-flexible";
import { pool } from "@/db/client";
import { AppError } from "@/lib/errors";
import { describeWait, limitKey, LIMITS, type LimitRule } from "@/lib/auth/rate-limit-rules";

/**
 * Abuse limits counted by rate-limiter-flexible in PostgreSQL (table rate_limits, created by our
 * migrations), so every server behind a load balancer counts the same attempts. Each count is one
 * atomic upsert, so parallel attempts cannot all read the same count and pass.
 */

export interface Limited {
  retryAt: Date;
  message: string;
}

const globalForLimits = globalThis as unknown as { ondulaLimiters?: Map<string, RateLimiterPostgres> };

function limiter(rule: LimitRule): RateLimiterPostgres {
  const limiters = (globalForLimits.ondulaLimiters ??= new Map());
  let found = limiters.get(rule.prefix);
  if (!found) {
    found = new RateLimiterPostgres({
      storeClient: pool(),
      storeType: "pool",
      tableName: "rate_limits",
      tableCreated: true,
      // The rule's prefix is already part of the key (limitKey).
      keyPrefix: "",
      points: rule.max,
      duration: Math.ceil(rule.windowMs / 1000),
      // One limiter sweeps expired rows for all: they share the table.
      clearExpiredByTimeout: limiters.size === 0,
    });
    limiters.set(rule.prefix, found);
  }
  return found;
}

/** The stored key: the column holds 255 characters, and an address typed in may be longer. */
function storedKey(rule: LimitRule, subject: string): string {
  const key = limitKey(rule, subject);
  return key.length <= 200 ? key : `${rule.prefix}:sha256:${createHash("sha256").update(key).digest("hex")}`;
}

/** The library rejects with its RateLimiterRes when a consume goes over; any other rejection is the store's error. */
async function counted(promise: Promise<RateLimiterRes>): Promise<RateLimiterRes> {
  try {
    return await promise;
  } catch (error) {
    if (error instanceof RateLimiterRes) return error;
    throw error;
  }
}

function limitedUntil(until: Date, what: string, now: Date): Limited {
  return {
    retryAt: until,
    message: `Too many ${what}. Try again ${describeWait(until, now)} (after ${until.toISOString().slice(11, 16)} UTC).`,
  };
}

/** The latest moment among the rules that block, or null when every rule allows an attempt now. */
export async function checkLimits(checks: Array<[LimitRule, string]>, what: string): Promise<Limited | null> {
  const now = new Date();
  let worst: Date | null = null;
  for (const [rule, subject] of checks) {
    const res = await limiter(rule).get(storedKey(rule, subject));
    if (!res || res.consumedPoints < rule.max) continue;
    const at = new Date(now.getTime() + Math.max(res.msBeforeNext, 1000));
    if (!worst || at > worst) worst = at;
  }
  return worst ? limitedUntil(worst, what, now) : null;
}

export interface Attempt {
  checks: Array<[LimitRule, string]>;
}

/**
 * Counts an attempt before it is made (before the slow password comparison), so parallel
 * attempts cannot all pass: each key's count goes up in one statement, and an attempt that took
 * a count past its rule's limit is refused and its counts are taken back. Let through, the
 * attempt comes back for `markAttemptSucceeded` once the outcome is known.
 */
export async function consumeAttempt(checks: Array<[LimitRule, string]>, what: string): Promise<{ limited: Limited } | { attempt: Attempt }> {
  const now = new Date();
  const results = await Promise.all(checks.map(([rule, subject]) => counted(limiter(rule).consume(storedKey(rule, subject), 1))));
  let worst: Date | null = null;
  results.forEach((res, i) => {
    if (res.consumedPoints <= checks[i][0].max) return;
    const at = new Date(now.getTime() + Math.max(res.msBeforeNext, 1000));
    if (!worst || at > worst) worst = at;
  });
  if (!worst) return { attempt: { checks } };
  await Promise.all(checks.map(([rule, subject]) => limiter(rule).reward(storedKey(rule, subject), 1)));
  return { limited: limitedUntil(worst, what, now) };
}

/**
 * A rule that counts failures gives back the point a successful attempt took, and only that one:
 * a success does not clear earlier failures, so an attacker who also knows one account's password
 * (their own) cannot reset the per-address count with it.
 */
export async function markAttemptSucceeded({ checks }: Attempt): Promise<void> {
  await Promise.all(
    checks.filter(([rule]) => rule.counts === "failures").map(([rule, subject]) => limiter(rule).reward(storedKey(rule, subject), 1)),
  );
}

/** Counts an attempt after the fact (a failure always; a success only where the rule counts every attempt). */
export async function recordAttempt(checks: Array<[LimitRule, string]>, succeeded: boolean): Promise<void> {
  await Promise.all(
    checks
      .filter(([rule]) => !succeeded || rule.counts === "all")
      .map(([rule, subject]) => counted(limiter(rule).penalty(storedKey(rule, subject), 1))),
  );
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
