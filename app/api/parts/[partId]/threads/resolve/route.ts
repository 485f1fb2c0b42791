import { handle, parseJson, parseParams } from "@/lib/http/handler";
import { requireUser } from "@/server/auth/session";
import { AppError } from "@/lib/errors";
import { partIdParams } from "@/lib/parts/schemas";
import { resolveBody } from "@/lib/sharing/schemas";
import { loadPart } from "@/server/parts";
import { assertThreadKey } from "@/server/sharing";
import { getThreadByKey, setThreadResolved } from "@/db/comments";

export const dynamic = "force-dynamic";

/** Resolves (or, with `resolved: false`, reopens) a thread: the owner or anyone it is shared with. */
export const POST = handle(async (request, { params }) => {
  const { partId } = await parseParams(params, partIdParams);
  const user = await requireUser();
  const body = await parseJson(request, resolveBody);
  const { part } = await loadPart(user, partId, "part:comment");
  assertThreadKey(part, body.thread);
  const found = await setThreadResolved({ partId, threadKey: body.thread, resolved: body.resolved, userId: user.id });
  if (!found) throw new AppError("not_found:thread", "There are no comments here to resolve yet.");
  return Response.json(await getThreadByKey({ partId, threadKey: body.thread }));
});
