import { handle, parseJson, parseParams } from "@/lib/http/handler";
import { requireUser } from "@/server/auth/session";
import { patchShareBody, shareParams } from "@/lib/sharing/schemas";
import { changeSharePermission, revokeShare } from "@/server/sharing";

export const dynamic = "force-dynamic";

export const PATCH = handle(async (request, { params }) => {
  const { partId, shareId } = await parseParams(params, shareParams);
  const user = await requireUser();
  const body = await parseJson(request, patchShareBody);
  return Response.json(await changeSharePermission(user, { partId, shareId, permission: body.permission }));
});

/** Revokes at once: every later request of that person is checked against the share and fails. */
export const DELETE = handle(async (_request, { params }) => {
  const { partId, shareId } = await parseParams(params, shareParams);
  const user = await requireUser();
  return Response.json(await revokeShare(user, { partId, shareId }));
});
