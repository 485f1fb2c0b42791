import { handle, parseJson, parseParams } from "@/lib/http/handler";
import { requireUser } from "@/server/auth/session";
import { partIdParams } from "@/lib/parts/schemas";
import { resolveBody } from "@/lib/sharing/schemas";
import { resolveThread } from "@/server/comments";

export const dynamic = "force-dynamic";

/** Resolves (or, with `resolved: false`, reopens) a thread: the owner or anyone it is shared with. */
export const POST = handle(async (request, { params }) => {
  const { partId } = await parseParams(params, partIdParams);
  const user = await requireUser();
  const body = await parseJson(request, resolveBody);
  return Response.json(await resolveThread(user, { partId, threadKey: body.thread, resolved: body.resolved }));
});
