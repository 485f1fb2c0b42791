import "server-only";
import { getServerSession } from "next-auth";
import { cache } from "react";
import { getUserById } from "@/db/users";
import { AppError } from "@/lib/errors";
import { authOptions } from "./options";
import type { CurrentUser } from "@/lib/auth/types";

interface OndulaSession {
  userId?: string;
  epoch?: number;
}

/**
 * The signed-in user, or null. The JWT only names the account; the row is read again on every
 * call, so a role change takes effect at once, and a disabled account or a moved session epoch
 * (disable, password change or reset) ends the session although the cookie is still valid.
 * Memoized per request (React `cache`) where React provides a request scope.
 * Works in route handlers, server components and server actions (it reads `next/headers`).
 */
export const getCurrentUser = cache(async function getCurrentUser(): Promise<CurrentUser | null> {
  let session: OndulaSession | null;
  try {
    session = (await getServerSession(authOptions())) as OndulaSession | null;
  } catch {
    // A malformed or foreign cookie is treated as no session.
    return null;
  }
  if (!session?.userId || !/^[0-9a-f-]{36}$/i.test(session.userId)) return null;
  const row = await getUserById({ userId: session.userId });
  if (!row || row.status !== "active" || row.sessionEpoch !== (session.epoch ?? 0)) return null;
  return { id: row.id, email: row.email, name: row.name, role: row.role, emailVerified: row.emailVerifiedAt !== null };
});

export async function requireUser(): Promise<CurrentUser> {
  const user = await getCurrentUser();
  if (!user) throw new AppError("unauthorized:session", "Sign in to continue.");
  return user;
}
