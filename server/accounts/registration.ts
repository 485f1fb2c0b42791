import "server-only";
import { consumeToken, issueToken, peekToken } from "@/db/tokens";
import type { User } from "@/db/schema";
import { createUser, getUserByEmail, getUserById, markEmailVerified, setUserPassword } from "@/db/users";
import { hashPassword, verifyPassword } from "@/lib/auth/password";
import { checkLimits, rateLimitError, recordAttempt, resetChecks } from "@/server/auth/rate-limit";
import type { CurrentUser } from "@/lib/auth/types";
import { config } from "@/lib/config";
import { AppError } from "@/lib/errors";
import { transaction } from "@/db/client";
import { queueMail } from "@/server/outbox/queue";
import { accountExistsMail, appLink, resetPasswordMail, verifyEmailMail } from "@/lib/mail/templates";

/**
 * Creates the account, or — when the address already has one — changes nothing. The caller
 * answers the same either way (so sign-up cannot tell who has an account) and runs `mail` after
 * answering: the confirmation link to a new account, a notice to the existing one's owner.
 */
/**
 * Creates the account, or — when the address already has one — changes nothing and mails its owner
 * a notice. `created` is the new account, which the sign-up signs in; the mail goes after the answer.
 */
export async function signUp(input: { name: string; email: string; password: string; role: "player" | "teacher" }): Promise<{ email: string; mail: () => Promise<void>; created: User | null }> {
  const user = await createUser({
    name: input.name, email: input.email, role: input.role, passwordHash: await hashPassword(input.password),
  });
  if (!user) {
    return {
      email: input.email,
      created: null,
      mail: async () => {
        const existing = await getUserByEmail({ email: input.email });
        if (!existing || existing.status !== "active") return;
        await queueMail(existing.email, accountExistsMail({ name: existing.name, url: appLink(config().APP_URL, "/sign-in", { email: existing.email }) }));
      },
    };
  }
  return { email: user.email, created: user, mail: () => sendVerification({ userId: user.id, email: user.email, name: user.name }) };
}

export async function sendVerification({ userId, email, name }: { userId: string; email: string; name: string }) {
  await transaction(async (tx) => {
    const token = await issueToken({ purpose: "verify_email", userId, email, tx });
    await queueMail(email, verifyEmailMail({ name, url: appLink(config().APP_URL, "/verify-email", { token }) }), { tx });
  });
}

/** Confirms the address the token was sent to; false when the link is unknown, used or expired. */
export async function verifyEmail({ token }: { token: string }): Promise<boolean> {
  const row = await consumeToken({ purpose: "verify_email", token });
  if (!row?.userId) return false;
  const user = await getUserById({ userId: row.userId });
  // The address may have changed since; only the address the link went to is confirmed.
  if (!user || user.email.toLowerCase() !== row.email.toLowerCase()) return false;
  await markEmailVerified({ userId: user.id });
  return true;
}

/**
 * Sends a reset link when the account exists and is active. The answer is the same either way,
 * so the form cannot be used to find out who has an account; the rate limit counts every request.
 */
export async function requestPasswordReset({ email, address }: { email: string; address: string }) {
  const checks = resetChecks(email, address);
  const limited = await checkLimits(checks, "reset requests");
  if (limited) throw rateLimitError(limited, "rate_limited:reset");
  await recordAttempt(checks, false);
  return { mail: () => sendResetLink({ email }) };
}

/** The account lookup and the mail, run after the answer so its timing tells nothing. */
async function sendResetLink({ email }: { email: string }) {
  const user = await getUserByEmail({ email });
  if (!user || user.status !== "active") return;
  await transaction(async (tx) => {
    const token = await issueToken({ purpose: "reset_password", userId: user.id, email: user.email, tx });
    await queueMail(user.email, resetPasswordMail({ name: user.name, url: appLink(config().APP_URL, "/reset-password", { token }) }), { tx });
  });
}

/** Sets the new password and ends every session of the account. */
export async function resetPassword({ token, password }: { token: string; password: string }) {
  const row = await consumeToken({ purpose: "reset_password", token });
  const user = row?.userId ? await getUserById({ userId: row.userId }) : undefined;
  if (!user || user.status !== "active") {
    throw new AppError("bad_request:token", "This reset link is not valid any more. Ask for a new one.");
  }
  await setUserPassword({ userId: user.id, passwordHash: await hashPassword(password) });
  // Following the link proves the address too.
  if (user.email.toLowerCase() === row!.email.toLowerCase()) await markEmailVerified({ userId: user.id });
}

export async function changePassword(user: CurrentUser, { current, next }: { current: string; next: string }) {
  const row = await getUserById({ userId: user.id });
  if (!row || !(await verifyPassword(current, row.passwordHash))) {
    throw new AppError("bad_request:password", "The current password is wrong.", { field: "current" });
  }
  await setUserPassword({ userId: user.id, passwordHash: await hashPassword(next) });
}

export type EmailLinkState = { state: "valid"; email: string } | { state: "used" | "expired" | "unknown" };

/**
 * Whether a link from an e-mail (password reset or address confirmation) would be accepted now,
 * without using it, so the page shows the right form.
 */
export async function checkEmailLink(purpose: "reset_password" | "verify_email", token: unknown): Promise<EmailLinkState> {
  if (typeof token !== "string" || token.length > 200) return { state: "unknown" };
  const peek = await peekToken({ purpose, token });
  return peek.state === "valid" ? { state: "valid", email: peek.row.email } : { state: peek.state };
}
