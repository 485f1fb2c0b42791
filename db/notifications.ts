import "server-only";
import { and, desc, eq, inArray, isNull, sql } from "drizzle-orm";
import type { NotificationDto } from "@/lib/sharing/dto";
import { db, type Executor } from "./client";
import { notifications, parts, users } from "./schema";

export type NotificationKind = "comment" | "proposal" | "proposal_accepted" | "proposal_declined" | "invitation_accepted" | "assignment";

export async function insertNotifications(rows: {
  userId: string;
  partId: string;
  kind: NotificationKind;
  noteKey: string | null;
  actorId: string;
  summary: string;
}[], { tx }: { tx?: Executor } = {}): Promise<void> {
  if (rows.length) await (tx ?? db()).insert(notifications).values(rows);
}

export async function listNotificationsForUser({ userId, partId, limit = 50 }: { userId: string; partId?: string; limit?: number }): Promise<NotificationDto[]> {
  const rows = await db()
    .select({
      id: notifications.id,
      partId: notifications.partId,
      kind: notifications.kind,
      threadKey: notifications.noteKey,
      actorName: users.name,
      summary: notifications.summary,
      readAt: notifications.readAt,
      createdAt: notifications.createdAt,
    })
    .from(notifications)
    .leftJoin(users, eq(users.id, notifications.actorId))
    .where(and(eq(notifications.userId, userId), partId ? eq(notifications.partId, partId) : undefined))
    .orderBy(desc(notifications.createdAt))
    .limit(limit);
  return rows.map(({ readAt, createdAt, ...r }) => ({ ...r, read: readAt !== null, createdAt: createdAt.toISOString() }));
}

/** Unread counts per part for the user (parts with none are left out). */
export async function countUnreadByPart({ userId, partId }: { userId: string; partId?: string }): Promise<{ partId: string; unread: number }[]> {
  return db()
    .select({ partId: notifications.partId, unread: sql<number>`count(*)::int` })
    .from(notifications)
    .where(and(eq(notifications.userId, userId), isNull(notifications.readAt), partId ? eq(notifications.partId, partId) : undefined))
    .groupBy(notifications.partId);
}

export async function markNotificationsRead({ userId, partId, threadKey, kind }: { userId: string; partId: string; threadKey?: string; kind?: NotificationKind }): Promise<number> {
  const rows = await db()
    .update(notifications)
    .set({ readAt: new Date() })
    .where(
      and(
        eq(notifications.userId, userId),
        eq(notifications.partId, partId),
        isNull(notifications.readAt),
        threadKey ? eq(notifications.noteKey, threadKey) : undefined,
        kind ? eq(notifications.kind, kind) : undefined,
      ),
    )
    .returning({ id: notifications.id });
  return rows.length;
}

export interface ClaimedBatch {
  ids: string[];
  recipient: { id: string; email: string; name: string };
  partTitle: string;
  items: { kind: string; threadKey: string | null; summary: string; createdAt: Date }[];
}

/**
 * Claims the unread notifications of one (recipient, part) that have not been e-mailed, when no
 * e-mail for that pair went out within the window and the recipient wants e-mail. The claim
 * stamps `emailed_at` under a transaction-scoped advisory lock on the pair, so two requests at
 * once cannot both send. Null: nothing to send now (the items stay pending).
 */
export async function claimEmailBatch({ userId, partId, windowMs, now = new Date(), tx: outer }: {
  userId: string;
  partId: string;
  windowMs: number;
  now?: Date;
  /** The caller's transaction: the claim (and its lock) then lasts until that one ends. */
  tx?: Executor;
}): Promise<ClaimedBatch | null> {
  return (outer ?? db()).transaction(async (tx) => {
    await tx.execute(sql`select pg_advisory_xact_lock(hashtextextended(${`notify:${userId}:${partId}`}, 0))`);
    const [recipient] = await tx
      .select({ id: users.id, email: users.email, name: users.name, wants: users.emailNotifications, status: users.status })
      .from(users)
      .where(eq(users.id, userId));
    if (!recipient || !recipient.wants || recipient.status !== "active") return null;
    const [last] = await tx
      .select({ at: sql<string | null>`max(${notifications.emailedAt})` })
      .from(notifications)
      .where(and(eq(notifications.userId, userId), eq(notifications.partId, partId)));
    if (last?.at && new Date(last.at).getTime() + windowMs > now.getTime()) return null;
    const pending = await tx
      .select({ id: notifications.id, kind: notifications.kind, threadKey: notifications.noteKey, summary: notifications.summary, createdAt: notifications.createdAt })
      .from(notifications)
      .where(and(eq(notifications.userId, userId), eq(notifications.partId, partId), isNull(notifications.emailedAt), isNull(notifications.readAt)))
      .orderBy(notifications.createdAt);
    if (!pending.length) return null;
    const ids = pending.map((p) => p.id);
    await tx.update(notifications).set({ emailedAt: now }).where(inArray(notifications.id, ids));
    const [part] = await tx.select({ title: parts.title }).from(parts).where(eq(parts.id, partId));
    return {
      ids,
      recipient: { id: recipient.id, email: recipient.email, name: recipient.name },
      partTitle: part?.title ?? "your part",
      items: pending.map(({ id: _id, ...item }) => item),
    };
  });
}

/** (recipient, part) pairs with unread items not yet e-mailed and no e-mail within the window. */
export async function listDueEmailPairs({ windowMs, limit = 200 }: { windowMs: number; limit?: number }): Promise<{ userId: string; partId: string }[]> {
  const cutoff = new Date(Date.now() - windowMs);
  const result = await db().execute<{ user_id: string; part_id: string }>(sql`
    select p.user_id, p.part_id
    from (
      select distinct ${notifications.userId} as user_id, ${notifications.partId} as part_id
      from ${notifications}
      where ${notifications.emailedAt} is null and ${notifications.readAt} is null
    ) p
    join ${users} u on u.id = p.user_id and u.email_notifications and u.status = 'active'
    where not exists (
      select 1 from ${notifications} n
      where n.user_id = p.user_id and n.part_id = p.part_id and n.emailed_at > ${cutoff}
    )
    limit ${limit}`);
  return result.rows.map((r) => ({ userId: r.user_id, partId: r.part_id }));
}
