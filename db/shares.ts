import "server-only";
import { and, asc, desc, eq, isNotNull, isNull, sql } from "drizzle-orm";
import type { ShareDto, ShareStatus } from "@/lib/sharing/dto";
import { db, type Executor } from "./client";
import { comments, notifications, parts, proposals, shares, users, type Share } from "./schema";

export function shareStatus(s: Pick<Share, "acceptedAt" | "expiresAt">, now = new Date()): ShareStatus {
  if (s.acceptedAt) return "accepted";
  return s.expiresAt.getTime() <= now.getTime() ? "expired" : "pending";
}

function toShareDto(s: Share, userName: string | null): ShareDto {
  return {
    id: s.id,
    email: s.email,
    permission: s.permission,
    status: shareStatus(s),
    userName,
    acceptedAt: s.acceptedAt?.toISOString() ?? null,
    expiresAt: s.expiresAt.toISOString(),
    lastSentAt: s.lastSentAt.toISOString(),
    createdAt: s.createdAt.toISOString(),
  };
}

/** The part's live shares (revoked ones are gone from the owner's list). */
export async function listSharesByPartId({ partId }: { partId: string }): Promise<ShareDto[]> {
  const rows = await db()
    .select({ share: shares, userName: users.name })
    .from(shares)
    .leftJoin(users, eq(users.id, shares.userId))
    .where(and(eq(shares.partId, partId), isNull(shares.revokedAt)))
    .orderBy(asc(shares.createdAt));
  return rows.map((r) => toShareDto(r.share, r.userName));
}

export async function getShareById({ partId, shareId }: { partId: string; shareId: string }): Promise<Share | null> {
  const [row] = await db()
    .select()
    .from(shares)
    .where(and(eq(shares.id, shareId), eq(shares.partId, partId), isNull(shares.revokedAt)));
  return row ?? null;
}

export async function getShareDtoById({ partId, shareId }: { partId: string; shareId: string }): Promise<ShareDto | null> {
  const [row] = await db()
    .select({ share: shares, userName: users.name })
    .from(shares)
    .leftJoin(users, eq(users.id, shares.userId))
    .where(and(eq(shares.id, shareId), eq(shares.partId, partId)));
  return row ? toShareDto(row.share, row.userName) : null;
}

/** A live share of the part for this address (case-insensitive), if any. */
export async function getLiveShareByEmail({ partId, email }: { partId: string; email: string }): Promise<Share | null> {
  const [row] = await db()
    .select()
    .from(shares)
    .where(and(eq(shares.partId, partId), isNull(shares.revokedAt), sql`lower(${shares.email}) = lower(${email})`));
  return row ?? null;
}

export async function insertShare({ tx, ...values }: {
  partId: string;
  email: string;
  permission: "comment" | "propose";
  tokenHash: string;
  invitedBy: string;
  expiresAt: Date;
  tx?: Executor;
}): Promise<Share> {
  const [row] = await (tx ?? db()).insert(shares).values(values).returning();
  return row;
}

/** A new token for a pending invitation; the old link stops working. */
export async function renewShareTokenById({ shareId, tokenHash, expiresAt, tx }: { shareId: string; tokenHash: string; expiresAt: Date; tx?: Executor }): Promise<Share | null> {
  const [row] = await (tx ?? db())
    .update(shares)
    .set({ tokenHash, expiresAt, lastSentAt: new Date() })
    .where(and(eq(shares.id, shareId), isNull(shares.acceptedAt), isNull(shares.revokedAt)))
    .returning();
  return row ?? null;
}

export async function updateSharePermissionById({ shareId, permission }: { shareId: string; permission: "comment" | "propose" }): Promise<void> {
  await db().update(shares).set({ permission }).where(and(eq(shares.id, shareId), isNull(shares.revokedAt)));
}

export async function revokeShareById({ shareId }: { shareId: string }): Promise<void> {
  await db().update(shares).set({ revokedAt: new Date() }).where(and(eq(shares.id, shareId), isNull(shares.revokedAt)));
}

export interface ShareByToken {
  share: Share;
  partTitle: string;
  ownerId: string;
  ownerName: string;
}

export async function getShareByTokenHash({ tokenHash }: { tokenHash: string }): Promise<ShareByToken | null> {
  const [row] = await db()
    .select({ share: shares, partTitle: parts.title, ownerId: parts.ownerId, ownerName: users.name })
    .from(shares)
    .innerJoin(parts, eq(parts.id, shares.partId))
    .innerJoin(users, eq(users.id, parts.ownerId))
    .where(eq(shares.tokenHash, tokenHash));
  return row ?? null;
}

/**
 * Marks the invitation accepted by this user. Guarded on the row still being open, so two tabs
 * accepting at once cannot both win, and a revoked or expired invitation stays unused.
 */
export async function acceptShareById({ shareId, userId }: { shareId: string; userId: string }): Promise<boolean> {
  const rows = await db()
    .update(shares)
    .set({ userId, acceptedAt: new Date() })
    .where(
      and(
        eq(shares.id, shareId),
        isNull(shares.acceptedAt),
        isNull(shares.revokedAt),
        sql`${shares.expiresAt} > now()`,
      ),
    )
    .returning({ id: shares.id });
  return rows.length === 1;
}

export interface Participant {
  id: string;
  email: string;
  name: string;
  emailNotifications: boolean;
}

/** The owner and everyone with a live, accepted share: the people a part's activity concerns. */
export async function listParticipantsByPartId({ partId }: { partId: string }): Promise<Participant[]> {
  const cols = { id: users.id, email: users.email, name: users.name, emailNotifications: users.emailNotifications };
  const [owners, sharers] = await Promise.all([
    db().select(cols).from(parts).innerJoin(users, eq(users.id, parts.ownerId)).where(eq(parts.id, partId)),
    db()
      .select(cols)
      .from(shares)
      .innerJoin(users, eq(users.id, shares.userId))
      .where(and(eq(shares.partId, partId), isNotNull(shares.acceptedAt), isNull(shares.revokedAt))),
  ]);
  const seen = new Set<string>();
  return [...owners, ...sharers].filter((p) => (seen.has(p.id) ? false : (seen.add(p.id), true)));
}

/** Parts shared with the viewer (accepted, live), with unread counts and the latest activity. */
export async function listSharedPartsForViewer({ viewerId }: { viewerId: string }) {
  const unread = sql<number>`(select count(*)::int from ${notifications} where ${notifications.userId} = ${viewerId} and ${notifications.partId} = ${parts.id} and ${notifications.readAt} is null)`;
  const openProposals = sql<number>`(select count(*)::int from ${proposals} where ${proposals.partId} = ${parts.id} and ${proposals.status} = 'open')`;
  const lastComment = sql<Date | null>`(select max(${comments.createdAt}) from ${comments} where ${comments.partId} = ${parts.id})`;
  const lastProposal = sql<Date | null>`(select max(greatest(${proposals.createdAt}, ${proposals.decidedAt})) from ${proposals} where ${proposals.partId} = ${parts.id})`;
  const lastActivity = sql<string>`to_char(greatest(${parts.updatedAt}, ${lastComment}, ${lastProposal}) at time zone 'UTC', 'YYYY-MM-DD"T"HH24:MI:SS.MS"Z"')`;
  const rows = await db()
    .select({
      partId: parts.id,
      title: parts.title,
      ownerId: parts.ownerId,
      ownerName: users.name,
      ownerEmail: users.email,
      permission: shares.permission,
      unread,
      openProposals,
      lastActivityAt: lastActivity,
    })
    .from(shares)
    .innerJoin(parts, eq(parts.id, shares.partId))
    .innerJoin(users, eq(users.id, parts.ownerId))
    .where(and(eq(shares.userId, viewerId), isNotNull(shares.acceptedAt), isNull(shares.revokedAt)))
    .orderBy(desc(parts.updatedAt))
    .limit(500);
  // Two invitations to the same part (e.g. re-invited) show once.
  const seen = new Set<string>();
  return rows.filter((r) => (seen.has(r.partId) ? false : (seen.add(r.partId), true)));
}

