import { handle, parseParams } from "@/lib/http/handler";
import { requireUser } from "@/server/auth/session";
import { partIdParams } from "@/lib/parts/schemas";
import { loadPart } from "@/server/parts";
import { historyStateByPartId, undoLatest } from "@/db/markings";

export const dynamic = "force-dynamic";

export const POST = handle(async (_request, { params }) => {
  const { partId } = await parseParams(params, partIdParams);
  const user = await requireUser();
  await loadPart(user, partId, "marking:write");
  const changes = await undoLatest({ partId, actorId: user.id });
  const { canUndo, canRedo } = await historyStateByPartId({ partId, limit: 1 });
  return Response.json({ changes, canUndo, canRedo });
});
