import "server-only";
import { config } from "@/lib/config";
import { activityDigestMail } from "@/lib/mail/sharing-templates";
import { appLink } from "@/lib/mail/templates";
import { EMAIL_WINDOW_MS } from "@/lib/sharing/batching";
import { notificationPath, threadLabel } from "@/lib/sharing/note-label";
import { writtenBarsFromText } from "@/lib/musicxml/bar-names";
import { transaction, type Executor } from "@/db/client";
import { getPartTextById } from "@/db/parts";
import { claimEmailBatch, insertNotifications, listDueEmailPairs, type NotificationKind } from "@/db/notifications";
import { listParticipantsByPartId } from "@/db/shares";
import { queueMail } from "./outbox/queue";

/**
 * Notification e-mail is batched: a new notification e-mails its recipient at once when nothing
 * was e-mailed about that part to them in the last 10 minutes; otherwise it waits. Waiting items
 * go out with the next event for that recipient and part after the window, with any other event
 * (which also sweeps a few due pairs), or when the flush endpoint is called (a scheduled job in
 * deployment). "E-mails" means queues in the outbox, in the same transaction as the notification
 * (and, given `tx`, as the change it tells of): the worker sends it, the request never waits.
 */
export async function notifyParticipants({ partId, actorId, kind, threadKey, summary, onlyUserIds, tx }: {
  partId: string;
  actorId: string;
  kind: NotificationKind;
  threadKey: string | null;
  summary: string;
  /** Restrict to these people (e.g. a proposal's author); still only current participants. */
  onlyUserIds?: string[];
  /** The transaction of the change being told of; without it the notification has its own. */
  tx?: Executor;
}): Promise<void> {
  const participants = await listParticipantsByPartId({ partId });
  const recipients = participants.filter((p) => p.id !== actorId && (!onlyUserIds || onlyUserIds.includes(p.id)));
  const write = async (t: Executor) => {
    await insertNotifications(recipients.map((r) => ({ userId: r.id, partId, kind, noteKey: threadKey, actorId, summary })), { tx: t });
    for (const r of recipients) await emailIfDue({ userId: r.id, partId, tx: t });
  };
  if (tx) return write(tx);
  await transaction(write);
  await sweepDueNotifications();
}

/**
 * Queues the digests of a few other pairs whose window has passed, each in its own transaction;
 * called after an event (a caller that told inside its own transaction calls it after that one).
 */
export function sweepDueNotifications(): Promise<number> {
  return flushDueNotifications({ limit: 10 });
}

/** Queues one digest for the pair if the window allows; false when nothing is due. */
async function emailIfDue({ userId, partId, tx }: { userId: string; partId: string; tx: Executor }): Promise<boolean> {
  const batch = await claimEmailBatch({ userId, partId, windowMs: EMAIL_WINDOW_MS, tx });
  if (!batch) return false;
  const appUrl = config().APP_URL;
  const text = await getPartTextById({ partId });
  const bars = text ? writtenBarsFromText(text.musicxml, text.chosenPartId) : [];
  await queueMail(
    batch.recipient.email,
    activityDigestMail({
      name: batch.recipient.name,
      partTitle: batch.partTitle,
      items: batch.items.map((i) => ({ kind: i.kind, threadKey: i.threadKey, where: i.threadKey ? threadLabel(i.threadKey, bars) : null, summary: i.summary, url: appLink(appUrl, notificationPath(partId, i.kind, i.threadKey)) })),
      settingsUrl: appLink(appUrl, "/settings"),
    }),
    { tx },
  );
  return true;
}

/** Queues a digest for every (recipient, part) whose window has passed and who has pending items. */
export async function flushDueNotifications({ limit = 200 }: { limit?: number } = {}): Promise<number> {
  const pairs = await listDueEmailPairs({ windowMs: EMAIL_WINDOW_MS, limit });
  let sent = 0;
  for (const pair of pairs) if (await transaction((tx) => emailIfDue({ ...pair, tx }))) sent++;
  return sent;
}
