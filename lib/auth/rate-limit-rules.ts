/**
 * Abuse limits, as data. A rule allows `max` counted attempts per key within `windowMs`; the
 * block lifts when the oldest of the last `max` counted attempts leaves the window.
 */
export interface LimitRule {
  prefix: string;
  max: number;
  windowMs: number;
  /** Count only failures since the key's last success (sign-in), or every attempt (reset e-mails). */
  counts: "failures" | "all";
}

const MIN = 60_000;

export const LIMITS = {
  signInAccount: { prefix: "signin:account", max: 5, windowMs: 15 * MIN, counts: "failures" },
  signInAddress: { prefix: "signin:address", max: 20, windowMs: 15 * MIN, counts: "failures" },
  resetAccount: { prefix: "reset:account", max: 3, windowMs: 15 * MIN, counts: "all" },
  resetAddress: { prefix: "reset:address", max: 10, windowMs: 15 * MIN, counts: "all" },
  signInLinkAccount: { prefix: "link:account", max: 5, windowMs: 15 * MIN, counts: "all" },
  signInLinkAddress: { prefix: "link:address", max: 10, windowMs: 15 * MIN, counts: "all" },
  /** Mail Ondula sends to someone else on a person's behalf (part and studio invitations, resends). */
  mailSender: { prefix: "mail:sender", max: 50, windowMs: 60 * MIN, counts: "all" },
  /** One recipient, from anyone. */
  mailRecipient: { prefix: "mail:recipient", max: 20, windowMs: 60 * MIN, counts: "all" },
  /** One recipient about one thing (a part, a studio): stops invite/withdraw loops. */
  mailRecipientAbout: { prefix: "mail:recipient-about", max: 3, windowMs: 60 * MIN, counts: "all" },
  /** Confirmation links an account asks to have sent again. */
  verifyResend: { prefix: "mail:verify", max: 3, windowMs: 60 * MIN, counts: "all" },
} satisfies Record<string, LimitRule>;

export const limitKey = (rule: LimitRule, subject: string) => `${rule.prefix}:${subject.trim().toLowerCase()}`;

/**
 * When the key may try again, given the times of its counted attempts (any order), or null when
 * it may try now.
 */
export function retryAt(rule: LimitRule, counted: Date[], now: Date): Date | null {
  const inWindow = counted
    .filter((d) => now.getTime() - d.getTime() < rule.windowMs)
    .sort((a, b) => b.getTime() - a.getTime());
  if (inWindow.length < rule.max) return null;
  return new Date(inWindow[rule.max - 1].getTime() + rule.windowMs);
}

/** "in 14 minutes" — whole minutes, rounded up, never "in 0 minutes". */
export function describeWait(until: Date, now: Date): string {
  const minutes = Math.max(1, Math.ceil((until.getTime() - now.getTime()) / MIN));
  return minutes === 1 ? "in 1 minute" : `in ${minutes} minutes`;
}
