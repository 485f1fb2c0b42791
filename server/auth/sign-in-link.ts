import "server-only";
import { randomBytes } from "node:crypto";
import { z } from "zod";
import { consumeSignInLink, issueToken, peekToken } from "@/db/tokens";
import { claimAddress, getUserByEmail, getUserById } from "@/db/users";
import { config } from "@/lib/config";
import { safeCallbackPath } from "@/lib/http/safe-redirect";
import { transaction } from "@/db/client";
import { queueMail } from "@/server/outbox/queue";
import { appLink, signInLinkMail } from "@/lib/mail/templates";
import { hashPassword } from "@/lib/auth/password";
import { checkLimits, rateLimitError, recordAttempt } from "./rate-limit";
import { LIMITS, type LimitRule } from "@/lib/auth/rate-limit-rules";
import type { Role } from "@/lib/auth/types";

/**
 * Sign-in links: a second way to sign in, by proving the mailbox instead of knowing the password.
 * Requesting one answers the same whether or not the account exists; the link opens a page with a
 * button, and only the button's POST (next-auth's "sign-in-link" provider) uses the token, so a
 * mail scanner that fetches the link does not use it up.
 */

export const SIGN_IN_LINK_PATH = "/sign-in/link";

/** The one answer to every request, so the form cannot tell who has an account. */
export const SIGN_IN_LINK_SENT =
  "If an account uses this address, we sent it a sign-in link. It works once and for 15 minutes; check your inbox.";

/** 32 random bytes in base64url, as `newToken` makes them; anything else is not worth a query. */
export const signInLinkTokenSchema = z.string().regex(/^[A-Za-z0-9_-]{43}$/, "This sign-in link is incomplete.");

const requestChecks = (email: string, address: string): Array<[LimitRule, string]> => [
  [LIMITS.signInLinkAccount, email],
  [LIMITS.signInLinkAddress, address],
];

/** Using a link counts against the per-address sign-in limit, like a password attempt. */
export const linkUseChecks = (address: string): Array<[LimitRule, string]> => [[LIMITS.signInAddress, address]];

/**
 * Counts a request against the abuse limits (every request, found or not: mail is the cost being
 * limited) and throws 429 once a limit is reached.
 */
export async function admitSignInLinkRequest({ email, address }: { email: string; address: string }): Promise<void> {
  const checks = requestChecks(email, address);
  const limited = await checkLimits(checks, "sign-in link requests");
  if (limited) throw rateLimitError(limited, "rate_limited:sign_in_link");
  await recordAttempt(checks, false);
}

/** Mails a link when the address belongs to an active account; does nothing otherwise. */
export async function sendSignInLink({ email, callbackUrl }: { email: string; callbackUrl: string }): Promise<void> {
  const user = await getUserByEmail({ email });
  if (!user || user.status !== "active") return;
  const data = callbackUrl ? { callbackUrl: safeCallbackPath(callbackUrl) } : undefined;
  // The link and its e-mail are kept together or not at all.
  await transaction(async (tx) => {
    const token = await issueToken({ purpose: "sign_in_link", userId: user.id, email: user.email, data, tx });
    await queueMail(user.email, signInLinkMail({ name: user.name, url: appLink(config().APP_URL, SIGN_IN_LINK_PATH, { token }) }), { tx });
  });
}

export interface SignedInByLink {
  id: string;
  email: string;
  name: string;
  epoch: number;
}

/**
 * Uses the link and returns the account it signs in, or null when the link is unknown, used,
 * expired, or its account is disabled or has another address now. Following the link proves the
 * address, so an unconfirmed one is confirmed.
 */
export async function signInWithLink({ token }: { token: string }): Promise<SignedInByLink | null> {
  if (!signInLinkTokenSchema.safeParse(token).success) return null;
  const row = await consumeSignInLink({ token });
  if (!row?.userId) return null;
  const user = await getUserById({ userId: row.userId });
  // Disabled between the two statements: refuse (its session would not pass getCurrentUser anyway).
  if (!user || user.status !== "active") return null;
  if (!user.emailVerifiedAt) {
    // The address was never proved: whoever set the password may not own it (someone can sign
    // up with another person's address first). The mailbox's owner, proving it now, takes the
    // account over: the earlier password and every earlier session end.
    const epoch = await claimAddress({ userId: user.id, passwordHash: await hashPassword(randomBytes(32).toString("base64url")) });
    return { id: user.id, email: user.email, name: user.name, epoch };
  }
  return { id: user.id, email: user.email, name: user.name, epoch: user.sessionEpoch };
}

export type SignInLinkState =
  | { state: "valid"; email: string; userId: string; destination: string; expiresAt: Date }
  | { state: "used"; email: string; userId: string; destination: string }
  | { state: "expired"; email: string }
  | { state: "disabled"; email: string }
  | { state: "invalid" };

/** Where a link sign-in lands: the destination asked for when the link was requested, or the home of the role. */
function linkDestination(data: unknown, role: Role): string {
  const asked = (data as { callbackUrl?: unknown } | null)?.callbackUrl;
  return safeCallbackPath(asked, role === "admin" ? "/admin/users" : "/parts");
}

/** What the link page shows, without using the link. */
export async function lookUpSignInLink({ token }: { token: unknown }): Promise<SignInLinkState> {
  const parsed = signInLinkTokenSchema.safeParse(token);
  if (!parsed.success) return { state: "invalid" };
  const peek = await peekToken({ purpose: "sign_in_link", token: parsed.data });
  if (peek.state === "unknown" || !peek.row.userId) return { state: "invalid" };
  const user = await getUserById({ userId: peek.row.userId });
  // An account that changed its address since: the link went to a mailbox that no longer signs in.
  if (!user || user.email.toLowerCase() !== peek.row.email.toLowerCase()) return { state: "invalid" };
  const email = user.email;
  if (user.status !== "active") return { state: "disabled", email };
  if (peek.state === "expired") return { state: "expired", email };
  const destination = linkDestination(peek.row.data, user.role);
  if (peek.state === "used") return { state: "used", email, userId: user.id, destination };
  return { state: "valid", email, userId: user.id, destination, expiresAt: peek.row.expiresAt };
}
