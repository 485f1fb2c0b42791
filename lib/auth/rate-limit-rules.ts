/**
 * Abuse limits, as data. A rule allows `max` counted attempts per key within a window of
 * `windowMs` that opens with the key's first counted attempt (rate-limiter-flexible's fixed
 * window, counted by server/auth/rate-limit.ts); the block lifts when that window closes.
 */
export interface LimitRule {
  prefix: string;
  max: number;
  windowMs: number;
  /** Count only failures (sign-in: a success gives back its own count, never earlier ones), or every attempt (e-mails). */
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

/** "in 14 minutes" — whole minutes, rounded up, never "in 0 minutes". */
export function describeWait(until: Date, now: Date): string {
  const minutes = Math.max(1, Math.ceil((until.getTime() - now.getTime()) / MIN));
  return minutes === 1 ? "in 1 minute" : `in ${minutes} minutes`;
}
