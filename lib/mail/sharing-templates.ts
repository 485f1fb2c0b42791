import { compose, type MailContent } from "./templates";

export function shareInviteMail({ ownerName, partTitle, permission, url }: {
  ownerName: string;
  partTitle: string;
  permission: "comment" | "propose";
  url: string;
}): MailContent {
  const can = permission === "propose" ? "comment on its notes and propose markings" : "comment on its notes";
  return compose({
    subject: `${ownerName} shares “${partTitle}” with you on Ondula`,
    greeting: "Hello,",
    lines: [
      `${ownerName} shares the part “${partTitle}” with you on Ondula: you can see their markings and ${can}.`,
      "Sign in, or create an account, with this e-mail address to open it. The link works for 14 days.",
    ],
    action: { label: "Open the shared part", url },
    after: "If you do not know this person, ignore this message; nothing is shared until the link is used.",
  });
}

export interface DigestItem {
  /** The notification's kind; practice leads to the practice page. */
  kind?: string;
  threadKey: string | null;
  /** Where it happened as a player reads it ("bar 12", "the pickup", "the whole part"); null for the part itself. */
  where: string | null;
  summary: string;
  url: string;
}

/** One message for everything new on a part since the last e-mail about it. */
export function activityDigestMail({ name, partTitle, items, settingsUrl }: {
  name: string;
  partTitle: string;
  items: DigestItem[];
  settingsUrl: string;
}): MailContent {
  const first = items[0];
  const count = items.length === 1 ? "Something new" : `${items.length} new items`;
  return compose({
    subject: `${count} on “${partTitle}”`,
    greeting: `Hello ${name},`,
    lines: [
      `${count} on “${partTitle}”:`,
      ...items.map((i) => `• ${i.summary}${i.where ? ` (${i.where})` : ""} — ${i.url}`),
    ],
    action: { label: first.kind === "assignment" ? "Open the practice page" : first.where ? `Open ${first.where}` : "Open the part", url: first.url },
    after: `Ondula sends at most one message per part every 10 minutes. Turn these e-mails off in your settings: ${settingsUrl}`,
  });
}
