/** Roles an account can hold; chosen at sign-up (player or teacher), changed only by an admin. */
export const ROLES = ["player", "teacher", "admin"] as const;
export type Role = (typeof ROLES)[number];

/** The signed-in person as every server module sees them, re-read from the database per request. */
export interface CurrentUser {
  id: string;
  email: string;
  name: string;
  role: Role;
  emailVerified: boolean;
}
