import { dictionary } from "@zxcvbn-ts/language-common";
import { z } from "zod";

export const PASSWORD_MIN_LENGTH = 10;

/**
 * Common passwords refused at sign-up and on every change: the "passwords-common" list that
 * @zxcvbn-ts/language-common ships (about 49,000 of the most frequent leaked passwords),
 * compared case-insensitively. Server-only in practice: the list is too large for the browser.
 */
const common = new Set(dictionary["passwords-common"].map((p) => p.toLowerCase()));

export function isCommonPassword(password: string): boolean {
  return common.has(password.toLowerCase());
}

export const newPasswordSchema = z
  .string()
  .min(PASSWORD_MIN_LENGTH, `Use at least ${PASSWORD_MIN_LENGTH} characters.`)
  .max(200, "Use at most 200 characters.")
  .refine((p) => !isCommonPassword(p), "This password is on a list of common passwords; choose another.");
