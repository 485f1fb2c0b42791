import "server-only";
import { config } from "@/lib/config";
import { activityDigestMail } from "@/lib/mail/sharing-templates";
import { appLink } from "@/lib/mail/templates";
import { sendMail } from "@/lib/mail/send";
import { EMAIL_WINDOW_MS } from "@/lib/sharing/batching";
import { notificationPath, threadLabel } from "@/lib/sharing/note-label";
import { writtenBarsFromText } from "@/lib/musicxml/bar-names";
import { getPartTextById } from "@/db/parts";
import { claimEmailBatch, insertNotifications, listDueEmailPairs, releaseEmailBatch, type NotificationKind } from "@/db/notifications";
import { listParticipantsByPartId } from "@/db/shares";

/**
 * Notification e-mail is batched without a background worker: a new notification e-mails its
 * recipient at once when nothing was e-mailed about that part to them in the last 10 minutes;
 * otherwise it waits. Waiting items go out with the next event for that recipient and part after
 * the window, with any other event (which also sweeps a few due pairs), or when the flush
 * endpoint is called (a scheduled job in deployment).
 */
export async function notifyParticipants({ partId, actorId, kind, threadKey, summary, onlyUserIds }: {
  partId: string;
  actorId: string;
  kind: NotificationKind;
  threadKey: string | null;
  summary: string;
  /** Restrict to these people (e.g. a proposal's author); still only current participants. */
  onlyUserIds?: string[];
}): Promise<void> {
  const participants = await listParticipantsByPartId({ partId });
  const recipients = participants.filter((p) => p.id !== actorId && (!onlyUserIds || onlyUserIds.includes(p.id)));
  await insertNotifications(recipients.map((r) => ({ userId: r.id, partId, kind, noteKey: threadKey, actorId, summary })));
  for (const r of recipients) await emailIfDue({ userId: r.id, partId });
  await flushDueNotifications({ limit: 10 });
}

/** Sends one digest for the pair if the window allows; false when nothing went out. */
async function emailIfDue({ userId, partId }: { userId: string; partId: string }): Promise<boolean> {
  const batch = await claimEmailBatch({ userId, partId, windowMs: EMAIL_WINDOW_MS });
  if (!batch) return false;
  const appUrl = config().APP_URL;
  try {
    const text = await getPartTextById({ partId });
    const bars = text ? writtenBarsFromText(text.musicxml, text.chosenPartId) : [];
    await sendMail(
      batch.recipient.email,
      activityDigestMail({
        name: batch.recipient.name,
        partTitle: batch.partTitle,
        items: batch.items.map((i) => ({ kind: i.kind, threadKey: i.threadKey, where: i.threadKey ? threadLabel(i.threadKey, bars) : null, summary: i.summary, url: appLink(appUrl, notificationPath(partId, i.kind, i.threadKey)) })),
        settingsUrl: appLink(appUrl, "/settings"),
      }),
    );
    return true;
  } catch (err) {
    // The in-app notification stands; the e-mail is tried again on the next event or flush.
    console.error("[notify] e-mail failed:", err instanceof Error ? err.message : err);
    await releaseEmailBatch({ ids: batch.ids });
    return false;
  }
}

/** E-mails every (recipient, part) whose window has passed and who has pending items. */
export async function flushDueNotifications({ limit = 200 }: { limit?: number } = {}): Promise<number> {
  const pairs = await listDueEmailPairs({ windowMs: EMAIL_WINDOW_MS, limit });
  let sent = 0;
  for (const pair of pairs) if (await emailIfDue(pair)) sent++;
  return sent;
}
