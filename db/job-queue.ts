import PgBoss from "pg-boss";
import type { Pool, PoolClient } from "pg";
import { sql } from "drizzle-orm";
import { db, type Executor } from "./client";

/**
 * The job queue is pg-boss, in its own schema `pgboss` of the app's database: a job is a row, so
 * it is written in the same transaction as the change that causes it and is kept or dropped with it.
 */
export const JOB_SCHEMA = "pgboss";

/** Outgoing mail, one job per message. */
export const MAIL_QUEUE = "mail";

/**
 * How a message is retried when the SMTP server is down, silent or refuses: the n-th retry waits
 * between 2·2ⁿ⁻¹ and 2·2ⁿ s (pg-boss's exponential back-off with jitter: 2–4 s, 4–8 s, … ), 14
 * retries spread over roughly half a day before the job is marked failed. A job that is still
 * active after 2 minutes (its worker died mid-send) is handed out again.
 */
export const MAIL_QUEUE_POLICY = {
  retryLimit: 14,
  retryDelay: 2,
  retryBackoff: true,
  expireInSeconds: 120,
  // Sent and failed messages are kept for a week, then archived by pg-boss's maintenance.
  retentionMinutes: 7 * 24 * 60,
} as const;

/** What pg-boss runs its SQL through: `executeSql(text, values)`. */
export type JobDb = { executeSql: (text: string, values?: unknown[]) => Promise<{ rows: unknown[] }> };

/**
 * The SQL connection behind `executor`: an open transaction's own client (so the job is part of
 * that transaction), or the pool (one insert on its own). Drizzle keeps either on its session and
 * offers no public accessor; both answer pg's `query(text, values)`.
 */
export function jobDbFor(executor: Executor): JobDb {
  const client = (executor as unknown as { session: { client: Pool | PoolClient } }).session.client;
  return { executeSql: (text, values) => client.query(text, values) };
}

const globalForJobs = globalThis as unknown as { ondulaJobSender?: PgBoss };

/**
 * A pg-boss handle used only to write jobs (never started: no polling, no maintenance); each
 * `send` names the connection it writes through.
 */
function jobSender(): PgBoss {
  globalForJobs.ondulaJobSender ??= new PgBoss({ db: jobDbFor(db()), schema: JOB_SCHEMA, migrate: false, supervise: false, schedule: false });
  return globalForJobs.ondulaJobSender;
}

/** Writes one job through `executor`; its id is chosen by the caller so it can name the message. */
export async function insertJob({ queue, id, data, tx }: { queue: string; id: string; data: object; tx?: Executor }): Promise<void> {
  const sent = await jobSender().send(queue, data, { id, db: jobDbFor(tx ?? db()) });
  // pg-boss answers null when the queue does not exist (the schema was not installed).
  if (!sent) throw new Error(`job queue "${queue}" is missing: run the migrations (db/migrate.ts)`);
}

/**
 * Installs or upgrades pg-boss's schema and the mail queue with its retry policy; run with the
 * migrations. Idempotent.
 */
export async function installJobQueue(connectionString: string): Promise<void> {
  const boss = new PgBoss({ connectionString, schema: JOB_SCHEMA, migrate: true, supervise: false, schedule: false, max: 1 });
  boss.on("error", (error) => console.error("[jobs] install:", error.message));
  await boss.start();
  try {
    if (await boss.getQueue(MAIL_QUEUE)) await boss.updateQueue(MAIL_QUEUE, { name: MAIL_QUEUE, ...MAIL_QUEUE_POLICY });
    else await boss.createQueue(MAIL_QUEUE, { name: MAIL_QUEUE, ...MAIL_QUEUE_POLICY });
  } finally {
    await boss.stop({ graceful: false, close: true });
  }
}

export type QueueCounts = { waiting: number; active: number; failed: number };

/** Jobs of a queue by state: waiting (created or to be retried), active, failed for good. */
export async function countJobsByQueue({ queue }: { queue: string }): Promise<QueueCounts> {
  const result = await db().execute<{ state: string; n: number }>(
    sql`select state::text as state, count(*)::int as n from ${sql.identifier(JOB_SCHEMA)}.job where name = ${queue} group by state`,
  );
  const by = new Map(result.rows.map((r) => [r.state, Number(r.n)]));
  return { waiting: (by.get("created") ?? 0) + (by.get("retry") ?? 0), active: by.get("active") ?? 0, failed: by.get("failed") ?? 0 };
}
