import { bigint, index, integer, pgTable, primaryKey, text, timestamp, uuid, varchar } from "drizzle-orm/pg-core";
import { users } from "./auth";

/**
 * Abuse-limit counters, in the layout rate-limiter-flexible's PostgreSQL store reads and writes
 * (server/auth/rate-limit.ts): one row per limited key, `expire` in epoch milliseconds.
 */
export const rateLimits = pgTable("rate_limits", {
  key: varchar("key", { length: 255 }).primaryKey(),
  points: integer("points").notNull().default(0),
  expire: bigint("expire", { mode: "number" }),
});

/**
 * Idempotency keys of requests that create something (server/http/idempotency.ts). A row is
 * claimed before the request runs (`status` null, held until `lease_until`) and keeps the first
 * answer once it is given, so a retry with the same key gets that answer instead of a second
 * creation, until `expires_at`.
 */
export const idempotencyKeys = pgTable(
  "idempotency_keys",
  {
    userId: uuid("user_id").notNull().references(() => users.id, { onDelete: "cascade" }),
    route: text("route").notNull(),
    key: text("key").notNull(),
    /** A hash of the method, path, query, content type and body the key was first used with. */
    fingerprint: text("fingerprint").notNull(),
    status: integer("status"),
    body: text("body"),
    contentType: text("content_type"),
    leaseUntil: timestamp("lease_until", { withTimezone: true }).notNull(),
    expiresAt: timestamp("expires_at", { withTimezone: true }).notNull(),
    createdAt: timestamp("created_at", { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [primaryKey({ columns: [t.userId, t.route, t.key] }), index("idempotency_keys_expires_idx").on(t.expiresAt)],
);
