import "server-only";
import { assertCan } from "@/lib/auth/policy";
import type { CurrentUser } from "@/lib/auth/types";
import { AppError } from "@/lib/errors";
import { getUserById, updateUserProfile } from "@/db/users";

/** The signed-in person's own profile, for the settings page. */
export async function getProfile(user: CurrentUser): Promise<{ name: string; emailNotifications: boolean }> {
  const row = await getUserById({ userId: user.id });
  if (!row) throw new AppError("not_found:account", "This account no longer exists. Sign in again.");
  return { name: row.name, emailNotifications: row.emailNotifications };
}

export async function updateProfile(user: CurrentUser, input: { name: string; emailNotifications: boolean }): Promise<void> {
  assertCan(user, "account:edit", { type: "account", account: { id: user.id } });
  await updateUserProfile({ userId: user.id, name: input.name, emailNotifications: input.emailNotifications });
}
