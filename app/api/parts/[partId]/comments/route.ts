import { handle, parseJson, parseParams, parseQuery } from "@/lib/http/handler";
import { requireUser } from "@/server/auth/session";
import { partIdParams } from "@/lib/parts/schemas";
import { excerpt } from "@/lib/sharing/comment-text";
import { threadLabel } from "@/lib/sharing/note-label";
import { commentBody, threadQuery } from "@/lib/sharing/schemas";
import { notifyParticipants } from "@/server/notify";
import { loadPart } from "@/server/parts";
import { assertThreadKey } from "@/server/sharing";
import { getThreadByKey, insertComment } from "@/db/comments";

export const dynamic = "force-dynamic";

export const GET = handle(async (request, { params }) => {
  const { partId } = await parseParams(params, partIdParams);
  const user = await requireUser();
  const { thread } = parseQuery(request, threadQuery);
  const { part } = await loadPart(user, partId, "part:view");
  assertThreadKey(part, thread);
  return Response.json(await getThreadByKey({ partId, threadKey: thread }));
});

export const POST = handle(async (request, { params }) => {
  const { partId } = await parseParams(params, partIdParams);
  const user = await requireUser();
  const { thread } = parseQuery(request, threadQuery);
  const { body } = await parseJson(request, commentBody);
  const { part } = await loadPart(user, partId, "part:comment");
  assertThreadKey(part, thread);
  const comment = await insertComment({ partId, threadKey: thread, authorId: user.id, authorName: user.name, body });
  await notifyParticipants({
    partId,
    actorId: user.id,
    kind: "comment",
    threadKey: thread,
    summary: `${user.name} commented on ${threadLabel(thread)}: “${excerpt(body)}”`,
  });
  return Response.json(comment, { status: 201 });
});
