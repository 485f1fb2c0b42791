import { handle, parseJson, parseParams } from "@/lib/http/handler";
import { requireUser } from "@/server/auth/session";
import { commentBody, commentParams } from "@/lib/sharing/schemas";
import { deleteComment, editComment } from "@/server/comments";

export const dynamic = "force-dynamic";

export const PATCH = handle(async (request, { params }) => {
  const { partId, commentId } = await parseParams(params, commentParams);
  const user = await requireUser();
  const { body } = await parseJson(request, commentBody);
  return Response.json(await editComment(user, { partId, commentId, body }));
});

export const DELETE = handle(async (_request, { params }) => {
  const { partId, commentId } = await parseParams(params, commentParams);
  const user = await requireUser();
  return Response.json(await deleteComment(user, { partId, commentId }));
});
