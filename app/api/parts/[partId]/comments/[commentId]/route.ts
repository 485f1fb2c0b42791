import { handle, parseJson, parseParams } from "@/lib/http/handler";
import { requireUser } from "@/server/auth/session";
import { AppError } from "@/lib/errors";
import { commentBody, commentParams } from "@/lib/sharing/schemas";
import type { CurrentUser } from "@/lib/auth/types";
import { loadPart } from "@/server/parts";
import { deleteCommentById, getCommentById, getThreadByKey, updateCommentById } from "@/db/comments";

export const dynamic = "force-dynamic";

/** People edit and delete only their own comments; the part's owner included. */
async function loadOwnComment(user: CurrentUser, partId: string, commentId: string) {
  await loadPart(user, partId, "part:comment");
  const comment = await getCommentById({ partId, commentId });
  if (!comment) throw new AppError("not_found:comment", "This comment does not exist or has been deleted.");
  if (comment.authorId !== user.id) throw new AppError("forbidden:comment", "You can only edit or delete your own comments.");
  return comment;
}

export const PATCH = handle(async (request, { params }) => {
  const { partId, commentId } = await parseParams(params, commentParams);
  const user = await requireUser();
  const { body } = await parseJson(request, commentBody);
  const comment = await loadOwnComment(user, partId, commentId);
  await updateCommentById({ commentId, body });
  const thread = await getThreadByKey({ partId, threadKey: comment.threadKey });
  return Response.json(thread.comments.find((c) => c.id === commentId));
});

export const DELETE = handle(async (_request, { params }) => {
  const { partId, commentId } = await parseParams(params, commentParams);
  const user = await requireUser();
  await loadOwnComment(user, partId, commentId);
  await deleteCommentById({ commentId });
  return Response.json({ id: commentId, deleted: true });
});
