import { and, eq, gt, isNull, sql } from "drizzle-orm";
import { hashToken, newToken, TOKEN_TTL_MS } from "@/lib/auth/tokens";
import { db, type Executor } from "./client";
import { authTokens } from "./schema";

type Purpose = "verify_email" | "reset_password" | "sign_in_link";

/**
 * Stores the hash of a fresh token and returns the token itself, for the link only. `data` keeps
 * what the link needs besides proof of the mailbox (a sign-in link's destination).
 */
export async function issueToken({ purpose, userId, email, data, tx }: {
  purpose: Purpose;
  userId: string;
  email: string;
  data?: Record<string, string>;
  tx?: Executor;
}): Promise<string> {
  const { token, hash } = newToken();
  await (tx ?? db()).insert(authTokens).values({
    purpose, userId, email, data: data ?? null, tokenHash: hash, expiresAt: new Date(Date.now() + TOKEN_TTL_MS[purpose]),
  });
  return token;
}

/** Marks the token used and returns it, in one statement, so a token works exactly once. */
export async function consumeToken({ purpose, token }: { purpose: Purpose; token: string }) {
  const [row] = await db()
    .update(authTokens)
    .set({ usedAt: new Date() })
    .where(and(
      eq(authTokens.tokenHash, hashToken(token)),
      eq(authTokens.purpose, purpose),
      isNull(authTokens.usedAt),
      gt(authTokens.expiresAt, new Date()),
    ))
    .returning();
  return row ?? null;
}

/** Whether the token would be accepted now, without using it (to show the right form). */
export async function peekToken({ purpose, token }: { purpose: Purpose; token: string }) {
  const [row] = await db()
    .select()
    .from(authTokens)
    .where(and(eq(authTokens.tokenHash, hashToken(token)), eq(authTokens.purpose, purpose)));
  if (!row) return { state: "unknown" as const };
  if (row.usedAt) return { state: "used" as const, row };
  if (row.expiresAt <= new Date()) return { state: "expired" as const, row };
  return { state: "valid" as const, row };
}

/**
 * Uses a sign-in link and returns it with the account it signs in, in one statement: the token
 * is marked used only while the account is active and still has the address the link went to,
 * so a refused sign-in (disabled account) leaves the link as it was, and two clicks racing each
 * other cannot both sign in.
 */
export async function consumeSignInLink({ token }: { token: string }) {
  const [row] = await db()
    .update(authTokens)
    .set({ usedAt: new Date() })
    .where(and(
      eq(authTokens.tokenHash, hashToken(token)),
      eq(authTokens.purpose, "sign_in_link"),
      isNull(authTokens.usedAt),
      gt(authTokens.expiresAt, new Date()),
      // Written out with the table name: inside the subquery a bare "email" would mean u.email.
      sql`exists (select 1 from users u where u.id = auth_tokens.user_id and u.status = 'active' and lower(u.email) = lower(auth_tokens.email))`,
    ))
    .returning();
  return row ?? null;
}
