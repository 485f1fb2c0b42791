import { handle, parseQuery } from "@/lib/http/handler";
import { requireUser } from "@/server/auth/session";
import { notificationsQuery } from "@/lib/sharing/schemas";
import { listNotifications } from "@/server/notifications";

export const dynamic = "force-dynamic";

/** The viewer's own notifications: for one part (`?partId=`) or across all parts. */
export const GET = handle(async (request) => {
  const user = await requireUser();
  const { partId } = parseQuery(request, notificationsQuery);
  return Response.json(await listNotifications(user, partId));
});
