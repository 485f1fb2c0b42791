import { and, asc, desc, eq, gt, isNull } from "drizzle-orm";
import { hashToken, newToken, TOKEN_TTL_MS } from "@/lib/auth/tokens";
import { db, type Executor } from "./client";
import { studioInvitations, studioMembers, studios, users, type Studio } from "./schema";

export async function getStudioById({ studioId }: { studioId: string }): Promise<Studio | undefined> {
  const [row] = await db().select().from(studios).where(eq(studios.id, studioId));
  return row;
}

export async function getStudioByTeacherId({ teacherId }: { teacherId: string }): Promise<Studio | undefined> {
  const [row] = await db().select().from(studios).where(eq(studios.teacherId, teacherId));
  return row;
}

/** A teacher's studio comes into being the first time it is needed (also after a role change). */
export async function ensureStudioForTeacher({ teacherId, teacherName }: { teacherId: string; teacherName: string }): Promise<Studio> {
  await db().insert(studios).values({ teacherId, name: `${teacherName}'s studio` }).onConflictDoNothing();
  return (await getStudioByTeacherId({ teacherId }))!;
}

export async function isStudioMember({ studioId, playerId }: { studioId: string; playerId: string }): Promise<boolean> {
  const [row] = await db()
    .select({ playerId: studioMembers.playerId })
    .from(studioMembers)
    .where(and(eq(studioMembers.studioId, studioId), eq(studioMembers.playerId, playerId)));
  return !!row;
}

export async function listStudioMembers({ studioId }: { studioId: string }) {
  return db()
    .select({ playerId: users.id, name: users.name, email: users.email, joinedAt: studioMembers.joinedAt })
    .from(studioMembers)
    .innerJoin(users, eq(users.id, studioMembers.playerId))
    .where(eq(studioMembers.studioId, studioId))
    .orderBy(asc(users.name));
}

export async function listOpenInvitations({ studioId }: { studioId: string }) {
  return db()
    .select({ id: studioInvitations.id, email: studioInvitations.email, expiresAt: studioInvitations.expiresAt, createdAt: studioInvitations.createdAt })
    .from(studioInvitations)
    .where(and(eq(studioInvitations.studioId, studioId), isNull(studioInvitations.acceptedAt), gt(studioInvitations.expiresAt, new Date())))
    .orderBy(desc(studioInvitations.createdAt));
}

export async function listStudiosByPlayerId({ playerId }: { playerId: string }) {
  return db()
    .select({
      studioId: studios.id, name: studios.name, teacherName: users.name, teacherEmail: users.email, joinedAt: studioMembers.joinedAt,
    })
    .from(studioMembers)
    .innerJoin(studios, eq(studios.id, studioMembers.studioId))
    .innerJoin(users, eq(users.id, studios.teacherId))
    .where(eq(studioMembers.playerId, playerId))
    .orderBy(asc(studios.name));
}

export async function createInvitation({ studioId, email, tx }: { studioId: string; email: string; tx?: Executor }): Promise<string> {
  const { token, hash } = newToken();
  await (tx ?? db()).insert(studioInvitations).values({
    studioId, email: email.trim(), tokenHash: hash, expiresAt: new Date(Date.now() + TOKEN_TTL_MS.studio_invite),
  });
  return token;
}

export async function getInvitationByToken({ token }: { token: string }) {
  const [row] = await db()
    .select({
      id: studioInvitations.id, email: studioInvitations.email, expiresAt: studioInvitations.expiresAt,
      acceptedAt: studioInvitations.acceptedAt, studioId: studios.id, studioName: studios.name,
      teacherId: studios.teacherId, teacherName: users.name,
    })
    .from(studioInvitations)
    .innerJoin(studios, eq(studios.id, studioInvitations.studioId))
    .innerJoin(users, eq(users.id, studios.teacherId))
    .where(eq(studioInvitations.tokenHash, hashToken(token)));
  return row;
}

/** Uses the invitation once and adds the member, in one transaction; false when already used or expired. */
export async function acceptInvitation({ invitationId, studioId, userId }: { invitationId: string; studioId: string; userId: string }): Promise<boolean> {
  return db().transaction(async (tx) => {
    const [used] = await tx
      .update(studioInvitations)
      .set({ acceptedAt: new Date(), acceptedBy: userId })
      .where(and(eq(studioInvitations.id, invitationId), isNull(studioInvitations.acceptedAt), gt(studioInvitations.expiresAt, new Date())))
      .returning({ id: studioInvitations.id });
    if (!used) return false;
    await tx.insert(studioMembers).values({ studioId, playerId: userId }).onConflictDoNothing();
    return true;
  });
}

export async function removeStudioMember({ studioId, playerId }: { studioId: string; playerId: string }): Promise<boolean> {
  const rows = await db()
    .delete(studioMembers)
    .where(and(eq(studioMembers.studioId, studioId), eq(studioMembers.playerId, playerId)))
    .returning({ playerId: studioMembers.playerId });
  return rows.length > 0;
}
