import "server-only";
import type { CurrentUser } from "@/lib/auth/types";
import { AppError } from "@/lib/errors";
import { checkLimits, rateLimitError, recordAttempt } from "./rate-limit";
import { LIMITS, type LimitRule } from "@/lib/auth/rate-limit-rules";

/**
 * Admits one mail that Ondula sends to someone else on `user`'s behalf (an invitation or its
 * resend), or throws. The sender must have proved their own address, so an unconfirmed account
 * cannot use Ondula to mail strangers; each sender and each recipient has a limit per hour, so
 * invite/withdraw loops cannot flood a mailbox (`about` names the part or studio). Every admitted
 * mail counts: call the function it returns once the mail is sent.
 */
export async function admitMailOnBehalf(user: CurrentUser, recipient: string, about: string): Promise<() => Promise<void>> {
  if (!user.emailVerified) {
    throw new AppError("forbidden:unconfirmed", "Confirm your e-mail address first (see Settings): then Ondula can send invitations for you.");
  }
  const checks: Array<[LimitRule, string]> = [
    [LIMITS.mailSender, user.id],
    [LIMITS.mailRecipient, recipient],
    [LIMITS.mailRecipientAbout, `${recipient.trim().toLowerCase()}|${about}`],
  ];
  const limited = await checkLimits(checks, "invitations");
  if (limited) throw rateLimitError(limited, "rate_limited:mail");
  // Counted once the mail went out, so a refused invitation (a duplicate, oneself) costs nothing.
  return () => recordAttempt(checks, true);
}

/** Admits sending an account's own confirmation link again (a few an hour). */
export async function admitVerificationResend(user: CurrentUser): Promise<void> {
  const checks: Array<[LimitRule, string]> = [[LIMITS.verifyResend, user.id]];
  const limited = await checkLimits(checks, "confirmation e-mails");
  if (limited) throw rateLimitError(limited, "rate_limited:mail");
  await recordAttempt(checks, true);
}
