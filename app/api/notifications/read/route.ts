import { handle, parseJson } from "@/lib/http/handler";
import { requireUser } from "@/server/auth/session";
import { readBody } from "@/lib/sharing/schemas";
import { markNotificationsRead } from "@/db/notifications";

export const dynamic = "force-dynamic";

/** Marks the viewer's notifications of a part (or of one thread in it) read. */
export const POST = handle(async (request) => {
  const user = await requireUser();
  const body = await parseJson(request, readBody);
  // Only the caller's own rows are touched, so a part they lost access to needs no policy check.
  const updated = await markNotificationsRead({ userId: user.id, partId: body.partId, threadKey: body.thread, kind: body.kind });
  return Response.json({ updated });
});
