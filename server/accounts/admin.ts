import "server-only";
import { getUserById, listUsers, setUserRole, setUserStatus } from "@/db/users";
import type { UserSort } from "@/lib/accounts/user-list";
import { assertCan } from "@/lib/auth/policy";
import type { CurrentUser, Role } from "@/lib/auth/types";
import { AppError } from "@/lib/errors";

async function target(admin: CurrentUser | null, userId: string, action: "account:change_role" | "account:set_status") {
  assertCan(admin, "admin:list_users", { type: "site" });
  const row = await getUserById({ userId });
  if (!row) throw new AppError("not_found:account", "Not found.");
  assertCan(admin, action, { type: "account", account: { id: row.id } });
  return row;
}

export async function changeRole(admin: CurrentUser | null, { userId, role }: { userId: string; role: Role }) {
  const row = await target(admin, userId, "account:change_role");
  await setUserRole({ userId: row.id, role });
  return row;
}

export async function changeStatus(admin: CurrentUser | null, { userId, status }: { userId: string; status: "active" | "disabled" }) {
  const row = await target(admin, userId, "account:set_status");
  await setUserStatus({ userId: row.id, status });
  return row;
}

/** One page of accounts for admins: search, sort and pages on the server. */
export async function listAccounts(admin: CurrentUser | null, q: { query: string; sort: UserSort; dir: "asc" | "desc"; page: number; pageSize: number }) {
  assertCan(admin, "admin:list_users", { type: "site" });
  const { rows, total } = await listUsers(q);
  return { rows, total, page: q.page, pageSize: q.pageSize };
}
