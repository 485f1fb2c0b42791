import { asc, count, desc, eq, ilike, or, sql, type SQL } from "drizzle-orm";
import type { Role } from "@/lib/auth/types";
import { db } from "./client";
import { users, type User } from "./schema";
import type { UserSort } from "@/lib/accounts/user-list";

const byEmail = (email: string) => sql`lower(${users.email}) = ${email.trim().toLowerCase()}`;

export async function getUserById({ userId }: { userId: string }): Promise<User | undefined> {
  const [row] = await db().select().from(users).where(eq(users.id, userId));
  return row;
}

export async function getUserByEmail({ email }: { email: string }): Promise<User | undefined> {
  const [row] = await db().select().from(users).where(byEmail(email));
  return row;
}

/** Inserts the account, or returns null when the address is already taken (unique index). */
export async function createUser(values: {
  email: string;
  name: string;
  role: Role;
  passwordHash: string;
  emailVerifiedAt?: Date | null;
}): Promise<User | null> {
  const [row] = await db()
    .insert(users)
    .values({ ...values, email: values.email.trim() })
    .onConflictDoNothing()
    .returning();
  return row ?? null;
}

export async function updateUserProfile({ userId, name, emailNotifications }: { userId: string; name: string; emailNotifications: boolean }) {
  await db().update(users).set({ name, emailNotifications, updatedAt: new Date() }).where(eq(users.id, userId));
}

/** Sets a new password and ends every session the account had (the epoch moves on). */
export async function setUserPassword({ userId, passwordHash }: { userId: string; passwordHash: string }) {
  await db()
    .update(users)
    .set({ passwordHash, sessionEpoch: sql`${users.sessionEpoch} + 1`, updatedAt: new Date() })
    .where(eq(users.id, userId));
}

/** Ends every session the account has (sign-out): their JWTs carry the old epoch. */
export async function bumpSessionEpoch({ userId }: { userId: string }) {
  await db().update(users).set({ sessionEpoch: sql`${users.sessionEpoch} + 1` }).where(eq(users.id, userId));
}

/**
 * Marks the address proved by someone who did not need the password: the password set before
 * (unknown to them) is replaced and every session ends. Returns the new session epoch.
 */
export async function claimAddress({ userId, passwordHash }: { userId: string; passwordHash: string }): Promise<number> {
  const [row] = await db()
    .update(users)
    .set({ passwordHash, emailVerifiedAt: sql`coalesce(${users.emailVerifiedAt}, now())`, sessionEpoch: sql`${users.sessionEpoch} + 1`, updatedAt: new Date() })
    .where(eq(users.id, userId))
    .returning({ sessionEpoch: users.sessionEpoch });
  return row.sessionEpoch;
}

export async function markEmailVerified({ userId }: { userId: string }) {
  await db()
    .update(users)
    .set({ emailVerifiedAt: sql`coalesce(${users.emailVerifiedAt}, now())`, updatedAt: new Date() })
    .where(eq(users.id, userId));
}

export async function setUserRole({ userId, role }: { userId: string; role: Role }) {
  await db().update(users).set({ role, updatedAt: new Date() }).where(eq(users.id, userId));
}

/** Disabling moves the epoch on too, so the account's JWTs stop working at once. */
export async function setUserStatus({ userId, status }: { userId: string; status: "active" | "disabled" }) {
  await db()
    .update(users)
    .set({
      status,
      updatedAt: new Date(),
      ...(status === "disabled" ? { sessionEpoch: sql`${users.sessionEpoch} + 1` } : {}),
    })
    .where(eq(users.id, userId));
}


const sortColumn = { name: users.name, email: users.email, role: users.role, status: users.status, created: users.createdAt };

export interface UserListItem {
  id: string;
  email: string;
  name: string;
  role: Role;
  status: "active" | "disabled";
  emailVerified: boolean;
  createdAt: Date;
}

/** One page of accounts for the admin table; search matches name or e-mail. */
export async function listUsers({ query, sort, dir, page, pageSize }: {
  query: string;
  sort: UserSort;
  dir: "asc" | "desc";
  page: number;
  pageSize: number;
}): Promise<{ rows: UserListItem[]; total: number }> {
  const q = query.trim();
  const escaped = q.replace(/[\\%_]/g, (c) => `\\${c}`);
  const where: SQL | undefined = q ? or(ilike(users.name, `%${escaped}%`), ilike(users.email, `%${escaped}%`)) : undefined;
  const order = dir === "asc" ? asc(sortColumn[sort]) : desc(sortColumn[sort]);
  const [rows, [{ total }]] = await Promise.all([
    db()
      .select({
        id: users.id, email: users.email, name: users.name, role: users.role, status: users.status,
        emailVerifiedAt: users.emailVerifiedAt, createdAt: users.createdAt,
      })
      .from(users)
      .where(where)
      .orderBy(order, asc(users.id))
      .limit(pageSize)
      .offset((page - 1) * pageSize),
    db().select({ total: count() }).from(users).where(where),
  ]);
  return {
    total,
    rows: rows.map(({ emailVerifiedAt, ...r }) => ({ ...r, emailVerified: emailVerifiedAt !== null })),
  };
}

