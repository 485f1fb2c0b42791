import { handle, parseJson, parseParams, parseQuery } from "@/lib/http/handler";
import { requireUser } from "@/server/auth/session";
import { partIdParams } from "@/lib/parts/schemas";
import { commentBody, threadQuery } from "@/lib/sharing/schemas";
import { getThread, postComment } from "@/server/comments";
import { idempotent } from "@/server/http/idempotency";

export const dynamic = "force-dynamic";

export const GET = handle(async (request, { params }) => {
  const { partId } = await parseParams(params, partIdParams);
  const user = await requireUser();
  const { thread } = parseQuery(request, threadQuery);
  return Response.json(await getThread(user, partId, thread));
});

export const POST = handle(async (request, { params }) => {
  const { partId } = await parseParams(params, partIdParams);
  const user = await requireUser();
  const { thread } = parseQuery(request, threadQuery);
  return idempotent(request, user, async (request) => {
    const { body } = await parseJson(request, commentBody);
    return Response.json(await postComment(user, { partId, threadKey: thread, body }), { status: 201 });
  });
});
