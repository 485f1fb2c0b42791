import "server-only";
import { and, asc, eq, isNull, sql } from "drizzle-orm";
import type { CommentDto, ThreadDto, ThreadSummary } from "@/lib/sharing/dto";
import { db, type Executor } from "./client";
import { commentThreads, comments, users, type Comment } from "./schema";

export async function getThreadByKey({ partId, threadKey }: { partId: string; threadKey: string }): Promise<ThreadDto> {
  const [thread] = await db()
    .select({ id: commentThreads.id, resolvedAt: commentThreads.resolvedAt, resolvedByName: users.name })
    .from(commentThreads)
    .leftJoin(users, eq(users.id, commentThreads.resolvedBy))
    .where(and(eq(commentThreads.partId, partId), eq(commentThreads.threadKey, threadKey)));
  if (!thread) return { threadKey, resolved: false, resolvedAt: null, resolvedByName: null, comments: [] };
  const rows = await db()
    .select({ comment: comments, authorName: users.name })
    .from(comments)
    .innerJoin(users, eq(users.id, comments.authorId))
    .where(and(eq(comments.threadId, thread.id), isNull(comments.deletedAt)))
    .orderBy(asc(comments.createdAt), asc(comments.id));
  return {
    threadKey,
    resolved: thread.resolvedAt !== null,
    resolvedAt: thread.resolvedAt?.toISOString() ?? null,
    resolvedByName: thread.resolvedAt ? thread.resolvedByName : null,
    comments: rows.map((r) => toCommentDto(r.comment, threadKey, r.authorName)),
  };
}

function toCommentDto(c: Comment, threadKey: string, authorName: string): CommentDto {
  return {
    id: c.id,
    threadKey,
    authorId: c.authorId,
    authorName,
    body: c.body,
    createdAt: c.createdAt.toISOString(),
    updatedAt: c.updatedAt.toISOString(),
    edited: c.updatedAt.getTime() !== c.createdAt.getTime(),
  };
}

/** Adds a comment, creating the thread on first use; a new comment reopens a resolved thread. */
export async function insertComment({ partId, threadKey, authorId, authorName, body, tx: outer }: {
  partId: string;
  threadKey: string;
  authorId: string;
  authorName: string;
  body: string;
  /** The caller's transaction (then this runs in a savepoint of it). */
  tx?: Executor;
}): Promise<CommentDto> {
  return (outer ?? db()).transaction(async (tx) => {
    const [thread] = await tx
      .insert(commentThreads)
      .values({ partId, threadKey })
      .onConflictDoUpdate({
        target: [commentThreads.partId, commentThreads.threadKey],
        set: { resolvedAt: null, resolvedBy: null },
      })
      .returning({ id: commentThreads.id });
    const now = new Date();
    const [row] = await tx.insert(comments).values({ threadId: thread.id, partId, authorId, body, createdAt: now, updatedAt: now }).returning();
    return toCommentDto(row, threadKey, authorName);
  });
}

export interface CommentRef {
  id: string;
  partId: string;
  authorId: string;
  threadKey: string;
}

export async function getCommentById({ partId, commentId }: { partId: string; commentId: string }): Promise<CommentRef | null> {
  const [row] = await db()
    .select({ id: comments.id, partId: comments.partId, authorId: comments.authorId, threadKey: commentThreads.threadKey })
    .from(comments)
    .innerJoin(commentThreads, eq(commentThreads.id, comments.threadId))
    .where(and(eq(comments.id, commentId), eq(comments.partId, partId), isNull(comments.deletedAt)));
  return row ?? null;
}

export async function updateCommentById({ commentId, body }: { commentId: string; body: string }): Promise<Comment | null> {
  const [row] = await db()
    .update(comments)
    .set({ body, updatedAt: new Date() })
    .where(and(eq(comments.id, commentId), isNull(comments.deletedAt)))
    .returning();
  return row ?? null;
}

/** Soft delete: the row stays for the record, the text is cleared and it leaves every list. */
export async function deleteCommentById({ commentId }: { commentId: string }): Promise<void> {
  await db().update(comments).set({ body: "", deletedAt: new Date() }).where(eq(comments.id, commentId));
}

/** Resolves or reopens a thread; false when the thread has no comments yet. */
export async function setThreadResolved({ partId, threadKey, resolved, userId }: {
  partId: string;
  threadKey: string;
  resolved: boolean;
  userId: string;
}): Promise<boolean> {
  const rows = await db()
    .update(commentThreads)
    .set(resolved ? { resolvedAt: new Date(), resolvedBy: userId } : { resolvedAt: null, resolvedBy: null })
    .where(and(eq(commentThreads.partId, partId), eq(commentThreads.threadKey, threadKey)))
    .returning({ id: commentThreads.id });
  return rows.length === 1;
}

/** One row per thread with live comments: what the score's comment markers draw. */
export async function summarizeThreadsByPartId({ partId }: { partId: string }): Promise<ThreadSummary[]> {
  const rows = await db()
    .select({
      threadKey: commentThreads.threadKey,
      count: sql<number>`count(${comments.id})::int`,
      unresolved: sql<boolean>`${commentThreads.resolvedAt} is null`,
    })
    .from(commentThreads)
    .innerJoin(comments, and(eq(comments.threadId, commentThreads.id), isNull(comments.deletedAt)))
    .where(eq(commentThreads.partId, partId))
    .groupBy(commentThreads.id)
    .orderBy(asc(commentThreads.threadKey));
  return rows;
}

/** Every comment still standing on a part (deleted ones left out), oldest first: the stand copy prints them. */
export async function listCommentsByPartId({ partId }: { partId: string }): Promise<CommentDto[]> {
  const rows = await db()
    .select({ comment: comments, threadKey: commentThreads.threadKey, authorName: users.name })
    .from(comments)
    .innerJoin(commentThreads, eq(commentThreads.id, comments.threadId))
    .innerJoin(users, eq(users.id, comments.authorId))
    .where(and(eq(comments.partId, partId), isNull(comments.deletedAt)))
    .orderBy(asc(comments.createdAt), asc(comments.id));
  return rows.map((r) => toCommentDto(r.comment, r.threadKey, r.authorName));
}
