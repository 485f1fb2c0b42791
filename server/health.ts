import "server-only";
import { checkDatabase } from "@/db/health";
import { countJobsByQueue, MAIL_QUEUE, type QueueCounts } from "@/db/job-queue";
import { config } from "@/lib/config";
import { checkSmtp } from "@/lib/mail/health";
import pkg from "@/package.json";

/** The outbox's messages waiting (or between retries), being sent, and given up on. */
async function outboxCounts(): Promise<QueueCounts | { error: string }> {
  return countJobsByQueue({ queue: MAIL_QUEUE }).catch((error: unknown) => ({ error: error instanceof Error ? error.message : String(error) }));
}

/**
 * Whether the database and the mail server answer, and how the outbox stands; the app is
 * degraded without the database (mail down only delays messages, which wait in the outbox).
 */
export async function checkHealth() {
  const [database, smtp] = await Promise.all([checkDatabase(), checkSmtp(config().SMTP_URL)]);
  const ok = database.ok;
  const mail = { ...smtp, outbox: ok ? await outboxCounts() : null };
  return {
    ok,
    report: {
      status: ok ? "ok" : "degraded",
      version: pkg.version,
      database,
      mail,
      ...(ok ? {} : { reason: `database unreachable: ${database.error}` }),
    },
  };
}
