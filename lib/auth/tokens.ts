import { createHash, randomBytes } from "node:crypto";

/** How long each kind of single-use link stays valid. */
export const TOKEN_TTL_MS = {
  verify_email: 48 * 3600_000,
  reset_password: 3600_000,
  studio_invite: 14 * 24 * 3600_000,
  // Short: the link signs in without a password, so a copy left in a mailbox soon stops working.
  sign_in_link: 15 * 60_000,
} as const;

/** A random 32-byte token for a link, and the SHA-256 hash that is the only thing stored. */
export function newToken(): { token: string; hash: string } {
  const token = randomBytes(32).toString("base64url");
  return { token, hash: hashToken(token) };
}

export function hashToken(token: string): string {
  return createHash("sha256").update(token, "utf8").digest("hex");
}
