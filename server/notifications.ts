import "server-only";
import type { CurrentUser } from "@/lib/auth/types";
import { notificationPath } from "@/lib/sharing/note-label";
import { countUnreadByPart, listNotificationsForUser, markNotificationsRead } from "@/db/notifications";
import { loadPart } from "./parts";

/**
 * The viewer's own notifications: for one part (which must still be visible to them) or across
 * all parts, with unread counts per part.
 */
export async function listNotifications(user: CurrentUser, partId: string | undefined) {
  if (partId) await loadPart(user, partId, "part:view");
  const [items, counts] = await Promise.all([listNotificationsForUser({ userId: user.id, partId }), countUnreadByPart({ userId: user.id, partId })]);
  return {
    unread: counts.reduce((n, c) => n + c.unread, 0),
    parts: counts,
    items: items.map((i) => ({ ...i, url: notificationPath(i.partId, i.kind, i.threadKey) })),
  };
}

/** Marks the viewer's notifications of a part (or of one thread, or one kind) read. */
export async function markRead(user: CurrentUser, o: { partId: string; thread?: string; kind?: Parameters<typeof markNotificationsRead>[0]["kind"] }) {
  // Only the caller's own rows are touched, so a part they lost access to needs no policy check.
  return { updated: await markNotificationsRead({ userId: user.id, partId: o.partId, threadKey: o.thread, kind: o.kind }) };
}
