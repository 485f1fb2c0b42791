import "server-only";
import PgBoss from "pg-boss";
import { JOB_SCHEMA, MAIL_QUEUE } from "@/db/job-queue";
import { config } from "@/lib/config";
import { messageIdFor } from "@/lib/mail/message-id";
import { sendMail } from "@/lib/mail/send";
import type { MailJob } from "./queue";

/** Messages sent at once. */
const SENDERS = 3;

const globalForWorker = globalThis as unknown as { ondulaOutbox?: Promise<PgBoss | null> };

/**
 * Starts the outbox worker once per server process: it takes queued messages one at a time and
 * sends them. A failed attempt (server down, silent, refusing) throws, and pg-boss retries the job
 * with back-off (the queue's policy in db/job-queue.ts). Delivery is at least once: when the SMTP
 * server accepted a message but the job could not be marked done (the process died in between),
 * the message goes again, with the same Message-ID (the job's id) as the handle to drop the copy.
 */
export function startOutboxWorker(): Promise<PgBoss | null> {
  globalForWorker.ondulaOutbox ??= start().catch((error: unknown) => {
    // The app serves without the worker (messages wait in the outbox); the health check shows it.
    // It tries again shortly (the database may still be starting).
    console.error("[outbox] worker not started:", error instanceof Error ? error.message : error);
    globalForWorker.ondulaOutbox = undefined;
    setTimeout(() => void startOutboxWorker(), 10_000).unref();
    return null;
  });
  return globalForWorker.ondulaOutbox;
}

async function start(): Promise<PgBoss> {
  const { DATABASE_URL, APP_URL } = config();
  // Its own small pool, so polling never takes a connection a request is waiting for. pg-boss's
  // maintenance (expiring jobs stuck active, archiving done ones) runs here too; the schema is
  // installed by the migrations, never by a running server.
  const boss = new PgBoss({ connectionString: DATABASE_URL, schema: JOB_SCHEMA, max: SENDERS + 2, migrate: false, schedule: false, supervise: true });
  boss.on("error", (error) => console.error("[outbox]", error.message));
  await boss.start();
  // A few independent loops, so one message held by a slow server does not hold up the rest.
  for (let i = 0; i < SENDERS; i++) {
    await boss.work<MailJob>(MAIL_QUEUE, { batchSize: 1, pollingIntervalSeconds: 1 }, async ([job]) => {
      await sendMail(job.data.to, job.data.content, { messageId: messageIdFor(job.id, APP_URL) });
    });
  }
  return boss;
}

/** Stops the worker (tests and scripts that start it themselves). */
export async function stopOutboxWorker(): Promise<void> {
  const boss = await globalForWorker.ondulaOutbox;
  globalForWorker.ondulaOutbox = undefined;
  await boss?.stop({ graceful: true, timeout: 5_000 });
}
