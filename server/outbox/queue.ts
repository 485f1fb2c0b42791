import "server-only";
import { randomUUID } from "node:crypto";
import type { Executor } from "@/db/client";
import { insertJob, MAIL_QUEUE } from "@/db/job-queue";
import type { MailContent } from "@/lib/mail/templates";

/** What a mail job carries: the finished message, so a retry sends exactly what was queued. */
export interface MailJob {
  to: string;
  content: MailContent;
}

/**
 * Puts a message in the outbox. Given the open transaction of the change that causes it, the
 * message is kept or dropped with that change; without one it is a single insert. The outbox
 * worker (server/outbox/worker.ts) sends it; the request never waits for SMTP.
 */
export async function queueMail(to: string, content: MailContent, { tx }: { tx?: Executor } = {}): Promise<void> {
  const job: MailJob = { to, content };
  await insertJob({ queue: MAIL_QUEUE, id: randomUUID(), data: job, tx });
}
