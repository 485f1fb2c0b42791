/** At most one notification e-mail per part per recipient in this window. */
export const EMAIL_WINDOW_MS = 10 * 60_000;

/**
 * Whether the pending notifications of one (recipient, part) may be e-mailed now, given when the
 * last e-mail for that pair went out. Batching without a background worker: each new
 * notification (and the flush endpoint) asks this; when the answer is no, the items stay pending
 * until the first event or flush at or after `dueAt`.
 */
export function emailDecision(lastEmailedAt: Date | null, now: Date, windowMs = EMAIL_WINDOW_MS): { sendNow: boolean; dueAt: Date } {
  if (!lastEmailedAt) return { sendNow: true, dueAt: now };
  const dueAt = new Date(lastEmailedAt.getTime() + windowMs);
  return { sendNow: dueAt.getTime() <= now.getTime(), dueAt };
}
