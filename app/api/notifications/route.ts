import { handle, parseQuery } from "@/lib/http/handler";
import { requireUser } from "@/server/auth/session";
import { notificationsQuery } from "@/lib/sharing/schemas";
import { notificationPath } from "@/lib/sharing/note-label";
import { loadPart } from "@/server/parts";
import { countUnreadByPart, listNotificationsForUser } from "@/db/notifications";

export const dynamic = "force-dynamic";

/**
 * The viewer's own notifications: for one part (`?partId=`, which must still be visible to them)
 * or across all parts, with unread counts per part.
 */
export const GET = handle(async (request) => {
  const user = await requireUser();
  const { partId } = parseQuery(request, notificationsQuery);
  if (partId) await loadPart(user, partId, "part:view");
  const [items, counts] = await Promise.all([
    listNotificationsForUser({ userId: user.id, partId }),
    countUnreadByPart({ userId: user.id, partId }),
  ]);
  return Response.json({
    unread: counts.reduce((n, c) => n + c.unread, 0),
    parts: counts,
    items: items.map((i) => ({ ...i, url: notificationPath(i.partId, i.kind, i.threadKey) })),
  });
});
