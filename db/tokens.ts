import { and, eq, gt, isNull } from "drizzle-orm";
import { hashToken, newToken, TOKEN_TTL_MS } from "@/lib/auth/tokens";
import { db } from "./client";
import { authTokens } from "./schema";

type Purpose = "verify_email" | "reset_password";

/** Stores the hash of a fresh token and returns the token itself, for the link only. */
export async function issueToken({ purpose, userId, email }: { purpose: Purpose; userId: string; email: string }): Promise<string> {
  const { token, hash } = newToken();
  await db().insert(authTokens).values({
    purpose, userId, email, tokenHash: hash, expiresAt: new Date(Date.now() + TOKEN_TTL_MS[purpose]),
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
