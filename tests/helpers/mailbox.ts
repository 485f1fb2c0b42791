import { APP_URL, MAIL_API_URL } from "./env";
import type { CaughtMessage } from "@/lib/mail/caught-message";

export type MailSummary = CaughtMessage;

/** Polls the app's GET /api/dev/mail for the newest message to `to` matching `subject`. */
export async function waitForMail(to: string, subject: RegExp, timeoutMs = 10_000): Promise<MailSummary> {
  const started = Date.now();
  for (;;) {
    const res = await fetch(`${APP_URL}/api/dev/mail?to=${encodeURIComponent(to)}`);
    if (res.ok) {
      const found = ((await res.json()) as MailSummary[]).find((m) => subject.test(m.subject));
      if (found) return found;
    }
    if (Date.now() - started > timeoutMs) throw new Error(`no mail to ${to} matching ${subject} within ${timeoutMs} ms`);
    await new Promise((r) => setTimeout(r, 150));
  }
}

/** The first link in the message that points at `path` of the app. */
export function linkTo(mail: MailSummary, path: string): string {
  const link = mail.links.find((l) => l.startsWith(`${APP_URL}${path}`) || new URL(l).pathname === path);
  if (!link) throw new Error(`no link to ${path} in "${mail.subject}": ${mail.links.join(", ")}`);
  return link;
}

/** Switches the local mail server's SMTP side (scripts/mail-server.ts): down, silent or up. */
export async function setSmtp(state: "up" | "down" | "silent"): Promise<void> {
  const res = await fetch(`${MAIL_API_URL}/smtp/${state}`, { method: "POST" });
  if (!res.ok) throw new Error(`mail server refused to go ${state}: ${res.status} ${await res.text()}`);
}
