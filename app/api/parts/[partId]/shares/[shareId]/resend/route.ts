import { admitMailOnBehalf } from "@/lib/auth/mail-limits";
import { handle, parseParams } from "@/lib/http/handler";
import { requireUser } from "@/lib/auth/session";
import { AppError } from "@/lib/errors";
import { shareParams } from "@/lib/sharing/schemas";
import { loadPart } from "@/lib/server/parts";
import { resendInvitation } from "@/lib/server/sharing";
import { getShareById, getShareDtoById } from "@/db/shares";

export const dynamic = "force-dynamic";

export const POST = handle(async (_request, { params }) => {
  const { partId, shareId } = await parseParams(params, shareParams);
  const user = await requireUser();
  const { part } = await loadPart(user, partId, "part:share");
  const share = await getShareById({ partId, shareId });
  if (!share) throw new AppError("not_found:share", "This invitation does not exist or has been withdrawn. Reload the list.");
  const sent = await admitMailOnBehalf(user, share.email, `part:${partId}`);
  await resendInvitation(user, part, share);
  await sent();
  return Response.json(await getShareDtoById({ partId, shareId }));
});
