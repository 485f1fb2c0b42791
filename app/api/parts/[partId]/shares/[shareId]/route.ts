import { handle, parseJson, parseParams } from "@/lib/http/handler";
import { requireUser } from "@/server/auth/session";
import { AppError } from "@/lib/errors";
import { patchShareBody, shareParams } from "@/lib/sharing/schemas";
import { loadPart } from "@/server/parts";
import { getShareById, getShareDtoById, revokeShareById, updateSharePermissionById } from "@/db/shares";

export const dynamic = "force-dynamic";

async function loadShare(partId: string, shareId: string) {
  const share = await getShareById({ partId, shareId });
  if (!share) throw new AppError("not_found:share", "This invitation does not exist or has been withdrawn. Reload the list.");
  return share;
}

export const PATCH = handle(async (request, { params }) => {
  const { partId, shareId } = await parseParams(params, shareParams);
  const user = await requireUser();
  const body = await parseJson(request, patchShareBody);
  await loadPart(user, partId, "part:share");
  await loadShare(partId, shareId);
  await updateSharePermissionById({ shareId, permission: body.permission });
  return Response.json(await getShareDtoById({ partId, shareId }));
});

/** Revokes at once: every later request of that person is checked against the share and fails. */
export const DELETE = handle(async (_request, { params }) => {
  const { partId, shareId } = await parseParams(params, shareParams);
  const user = await requireUser();
  await loadPart(user, partId, "part:share");
  await loadShare(partId, shareId);
  await revokeShareById({ shareId });
  return Response.json({ id: shareId, revoked: true });
});
