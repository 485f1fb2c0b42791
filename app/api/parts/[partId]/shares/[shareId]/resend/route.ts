import { handle, parseParams } from "@/lib/http/handler";
import { requireUser } from "@/server/auth/session";
import { shareParams } from "@/lib/sharing/schemas";
import { resendShare } from "@/server/sharing";

export const dynamic = "force-dynamic";

export const POST = handle(async (_request, { params }) => {
  const { partId, shareId } = await parseParams(params, shareParams);
  const user = await requireUser();
  return Response.json(await resendShare(user, { partId, shareId }));
});
