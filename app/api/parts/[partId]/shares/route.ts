import { admitMailOnBehalf } from "@/lib/auth/mail-limits";
import { handle, parseJson, parseParams } from "@/lib/http/handler";
import { requireUser } from "@/lib/auth/session";
import { partIdParams } from "@/lib/parts/schemas";
import { inviteBody } from "@/lib/sharing/schemas";
import { loadPart } from "@/lib/server/parts";
import { inviteToPart } from "@/lib/server/sharing";
import { getShareDtoById, listSharesByPartId } from "@/db/shares";

export const dynamic = "force-dynamic";

export const GET = handle(async (_request, { params }) => {
  const { partId } = await parseParams(params, partIdParams);
  const user = await requireUser();
  await loadPart(user, partId, "part:share");
  return Response.json({ shares: await listSharesByPartId({ partId }) });
});

export const POST = handle(async (request, { params }) => {
  const { partId } = await parseParams(params, partIdParams);
  const user = await requireUser();
  const body = await parseJson(request, inviteBody);
  const { part } = await loadPart(user, partId, "part:share");
  const sent = await admitMailOnBehalf(user, body.email, `part:${partId}`);
  const share = await inviteToPart(user, part, body.email, body.permission);
  await sent();
  return Response.json(await getShareDtoById({ partId, shareId: share.id }), { status: 201 });
});
