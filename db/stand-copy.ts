import "server-only";
import { and, asc, eq, isNull } from "drizzle-orm";
import { db } from "./client";
import { commentThreads, comments, users } from "./schema";

export interface StandCopyComment {
  /** The note key, or "part" for the whole part's thread. */
  threadKey: string;
  authorId: string;
  authorName: string;
  body: string;
  createdAt: string;
}

/** Every comment still standing on a part (deleted ones left out), oldest first, for printing. */
export async function listCommentsForPrint({ partId }: { partId: string }): Promise<StandCopyComment[]> {
  const rows = await db()
    .select({ threadKey: commentThreads.threadKey, authorId: comments.authorId, authorName: users.name, body: comments.body, createdAt: comments.createdAt })
    .from(comments)
    .innerJoin(commentThreads, eq(commentThreads.id, comments.threadId))
    .innerJoin(users, eq(users.id, comments.authorId))
    .where(and(eq(comments.partId, partId), isNull(comments.deletedAt)))
    .orderBy(asc(comments.createdAt), asc(comments.id));
  return rows.map((r) => ({ ...r, createdAt: r.createdAt.toISOString() }));
}
