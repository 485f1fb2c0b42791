import "server-only";
import type { CurrentUser } from "@/lib/auth/types";
import { AppError } from "@/lib/errors";
import { excerpt } from "@/lib/sharing/comment-text";
import { threadLabel } from "@/lib/sharing/note-label";
import { deleteCommentById, getCommentById, getThreadByKey, insertComment, setThreadResolved, summarizeThreadsByPartId, updateCommentById } from "@/db/comments";
import { countOpenProposalsByPartId } from "@/db/proposals";
import { transaction } from "@/db/client";
import { notifyParticipants, sweepDueNotifications } from "./notify";
import { barsOfPart, loadPart } from "./parts";
import { assertThreadKey } from "./sharing";

export async function getThread(user: CurrentUser, partId: string, threadKey: string) {
  const { part } = await loadPart(user, partId, "part:view");
  assertThreadKey(part, threadKey);
  return getThreadByKey({ partId, threadKey });
}

export async function postComment(user: CurrentUser, o: { partId: string; threadKey: string; body: string }) {
  const { part } = await loadPart(user, o.partId, "part:comment");
  assertThreadKey(part, o.threadKey);
  // The comment, its notifications and their e-mail are kept together or not at all.
  const comment = await transaction(async (tx) => {
    const created = await insertComment({ partId: o.partId, threadKey: o.threadKey, authorId: user.id, authorName: user.name, body: o.body, tx });
    await notifyParticipants({
      partId: o.partId,
      actorId: user.id,
      kind: "comment",
      threadKey: o.threadKey,
      summary: `${user.name} commented on ${threadLabel(o.threadKey, barsOfPart(part))}: “${excerpt(o.body)}”`,
      tx,
    });
    return created;
  });
  await sweepDueNotifications();
  return comment;
}

/** People edit and delete only their own comments; the part's owner included. */
async function loadOwnComment(user: CurrentUser, partId: string, commentId: string) {
  await loadPart(user, partId, "part:comment");
  const comment = await getCommentById({ partId, commentId });
  if (!comment) throw new AppError("not_found:comment", "This comment does not exist or has been deleted.");
  if (comment.authorId !== user.id) throw new AppError("forbidden:comment", "You can only edit or delete your own comments.");
  return comment;
}

export async function editComment(user: CurrentUser, o: { partId: string; commentId: string; body: string }) {
  const comment = await loadOwnComment(user, o.partId, o.commentId);
  await updateCommentById({ commentId: o.commentId, body: o.body });
  const thread = await getThreadByKey({ partId: o.partId, threadKey: comment.threadKey });
  return thread.comments.find((c) => c.id === o.commentId);
}

export async function deleteComment(user: CurrentUser, o: { partId: string; commentId: string }): Promise<{ id: string; deleted: true }> {
  await loadOwnComment(user, o.partId, o.commentId);
  await deleteCommentById({ commentId: o.commentId });
  return { id: o.commentId, deleted: true };
}

/** Resolves (or reopens) a thread: the owner or anyone the part is shared with. */
export async function resolveThread(user: CurrentUser, o: { partId: string; threadKey: string; resolved: boolean }) {
  const { part } = await loadPart(user, o.partId, "part:comment");
  assertThreadKey(part, o.threadKey);
  const found = await setThreadResolved({ partId: o.partId, threadKey: o.threadKey, resolved: o.resolved, userId: user.id });
  if (!found) throw new AppError("not_found:thread", "There are no comments here to resolve yet.");
  return getThreadByKey({ partId: o.partId, threadKey: o.threadKey });
}

/** What the score's comment markers draw: per thread, live comments and open proposals. */
export async function summarizeThreads(user: CurrentUser, partId: string) {
  await loadPart(user, partId, "part:view");
  const [threads, proposals] = await Promise.all([summarizeThreadsByPartId({ partId }), countOpenProposalsByPartId({ partId })]);
  const byKey = new Map(threads.map((t) => [t.threadKey, { ...t, openProposals: 0 }]));
  for (const p of proposals) {
    const entry = byKey.get(p.noteKey) ?? { threadKey: p.noteKey, count: 0, unresolved: false, openProposals: 0 };
    entry.openProposals = p.count;
    byKey.set(p.noteKey, entry);
  }
  return { threads: [...byKey.values()].sort((a, b) => a.threadKey.localeCompare(b.threadKey)) };
}
