import { handle, parseJson } from "@/lib/http/handler";
import { requireUser } from "@/server/auth/session";
import { acceptBody } from "@/lib/sharing/schemas";
import { acceptInvitation } from "@/server/sharing";

export const dynamic = "force-dynamic";

/** Accepts an invitation for the signed-in account (the /share/accept page does the same). */
export const POST = handle(async (request) => {
  const user = await requireUser();
  const { token } = await parseJson(request, acceptBody);
  const { partId } = await acceptInvitation(token, user);
  return Response.json({ partId, url: `/parts/${partId}` });
});
