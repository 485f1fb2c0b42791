import { createHash } from "node:crypto";
import { and, eq, sql } from "drizzle-orm";
import { db } from "@/db/client";
import { notifications } from "@/db/schema";
import { MAIL_API_URL } from "./env";
import type { Client } from "./parts";
import type { CaughtMessage } from "@/lib/mail/caught-message";

export type CaughtMail = CaughtMessage;

/** Every message the local mailbox holds for this address, newest first. */
export async function mailTo(address: string): Promise<CaughtMail[]> {
  const res = await fetch(`${MAIL_API_URL}/messages?to=${encodeURIComponent(address)}`);
  if (!res.ok) throw new Error(`mailbox answered ${res.status}`);
  return res.json();
}

/** Waits until the mailbox holds `count` messages for the address matching `subject`. */
export async function waitForMails(address: string, subject: RegExp, count = 1, timeoutMs = 10_000): Promise<CaughtMail[]> {
  const started = Date.now();
  for (;;) {
    const found = (await mailTo(address)).filter((m) => subject.test(m.subject));
    if (found.length >= count) return found;
    if (Date.now() - started > timeoutMs) throw new Error(`expected ${count} mail(s) to ${address} matching ${subject}, found ${found.length}`);
    await new Promise((r) => setTimeout(r, 100));
  }
}

/** The invitation token in a share e-mail's link. */
export function tokenFromInvite(mail: CaughtMail): string {
  const link = mail.links.find((l) => l.includes("/share/accept?token="));
  if (!link) throw new Error(`no invitation link in "${mail.subject}"`);
  return new URL(link).searchParams.get("token")!;
}

export function sha256(text: string): string {
  return createHash("sha256").update(text, "utf8").digest("hex");
}

export const json = (body: unknown, method = "POST"): RequestInit => ({
  method,
  headers: { "content-type": "application/json" },
  body: JSON.stringify(body),
});

/** Invites `email` to the part and returns the share and the token from the e-mail it got. */
export async function invite(owner: Client, partId: string, email: string, permission: "comment" | "propose") {
  const before = (await mailTo(email)).length;
  const res = await owner.fetch(`/api/parts/${partId}/shares`, json({ email, permission }));
  if (res.status !== 201) throw new Error(`invite answered ${res.status}: ${await res.text()}`);
  const share = await res.json();
  const mails = await waitForMails(email, /shares/, before + 1);
  return { share, token: tokenFromInvite(mails[0]), mail: mails[0] };
}

export async function accept(client: Client, token: string) {
  return client.fetch("/api/shares/accept", json({ token }));
}

/**
 * Moves every e-mail stamp of the (recipient, part) pair back past the 10-minute batching window,
 * so the next event e-mails at once.
 */
export async function passEmailWindow(userId: string, partId: string) {
  await db()
    .update(notifications)
    .set({ emailedAt: sql`${notifications.emailedAt} - interval '11 minutes'` })
    .where(and(eq(notifications.userId, userId), eq(notifications.partId, partId), sql`${notifications.emailedAt} is not null`));
}
