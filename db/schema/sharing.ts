import { sql } from "drizzle-orm";
import { index, jsonb, integer, pgEnum, pgTable, text, timestamp, uniqueIndex, uuid } from "drizzle-orm/pg-core";
import { users } from "./auth";
import { parts } from "./parts";

export const sharePermission = pgEnum("share_permission", ["comment", "propose"]);
/** `stale`: the marking changed after the proposal was made, so it was not applied. */
export const proposalStatus = pgEnum("proposal_status", ["open", "accepted", "declined", "stale", "withdrawn"]);

export const shares = pgTable(
  "shares",
  {
    id: uuid("id").primaryKey().defaultRandom(),
    partId: uuid("part_id").notNull().references(() => parts.id, { onDelete: "cascade" }),
    email: text("email").notNull(),
    permission: sharePermission("permission").notNull(),
    tokenHash: text("token_hash").notNull(),
    invitedBy: uuid("invited_by").notNull().references(() => users.id, { onDelete: "cascade" }),
    userId: uuid("user_id").references(() => users.id, { onDelete: "cascade" }),
    acceptedAt: timestamp("accepted_at", { withTimezone: true }),
    revokedAt: timestamp("revoked_at", { withTimezone: true }),
    expiresAt: timestamp("expires_at", { withTimezone: true }).notNull(),
    lastSentAt: timestamp("last_sent_at", { withTimezone: true }).notNull().defaultNow(),
    createdAt: timestamp("created_at", { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [
    uniqueIndex("shares_token_idx").on(t.tokenHash),
    index("shares_part_idx").on(t.partId),
    index("shares_user_idx").on(t.userId),
  ],
);

/** A thread per note (threadKey = note key) and one for the whole part (threadKey = "part"). */
export const commentThreads = pgTable(
  "comment_threads",
  {
    id: uuid("id").primaryKey().defaultRandom(),
    partId: uuid("part_id").notNull().references(() => parts.id, { onDelete: "cascade" }),
    threadKey: text("thread_key").notNull(),
    resolvedAt: timestamp("resolved_at", { withTimezone: true }),
    resolvedBy: uuid("resolved_by").references(() => users.id, { onDelete: "set null" }),
    createdAt: timestamp("created_at", { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [uniqueIndex("comment_threads_part_key_idx").on(t.partId, t.threadKey)],
);

export const comments = pgTable(
  "comments",
  {
    id: uuid("id").primaryKey().defaultRandom(),
    threadId: uuid("thread_id").notNull().references(() => commentThreads.id, { onDelete: "cascade" }),
    partId: uuid("part_id").notNull().references(() => parts.id, { onDelete: "cascade" }),
    authorId: uuid("author_id").notNull().references(() => users.id, { onDelete: "cascade" }),
    body: text("body").notNull(),
    createdAt: timestamp("created_at", { withTimezone: true }).notNull().defaultNow(),
    updatedAt: timestamp("updated_at", { withTimezone: true }).notNull().defaultNow(),
    deletedAt: timestamp("deleted_at", { withTimezone: true }),
  },
  (t) => [index("comments_thread_idx").on(t.threadId, t.createdAt)],
);

export const proposals = pgTable(
  "proposals",
  {
    id: uuid("id").primaryKey().defaultRandom(),
    partId: uuid("part_id").notNull().references(() => parts.id, { onDelete: "cascade" }),
    noteKey: text("note_key").notNull(),
    authorId: uuid("author_id").notNull().references(() => users.id, { onDelete: "cascade" }),
    /** The marking version the proposal was made against (null: the note had no marking). */
    baseVersion: integer("base_version"),
    proposed: jsonb("proposed").notNull(),
    comment: text("comment").notNull().default(""),
    status: proposalStatus("status").notNull().default("open"),
    reply: text("reply"),
    decidedAt: timestamp("decided_at", { withTimezone: true }),
    createdAt: timestamp("created_at", { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [index("proposals_part_idx").on(t.partId, t.status)],
);

export const notifications = pgTable(
  "notifications",
  {
    id: uuid("id").primaryKey().defaultRandom(),
    userId: uuid("user_id").notNull().references(() => users.id, { onDelete: "cascade" }),
    partId: uuid("part_id").notNull().references(() => parts.id, { onDelete: "cascade" }),
    kind: text("kind").notNull(),
    noteKey: text("note_key"),
    actorId: uuid("actor_id").references(() => users.id, { onDelete: "set null" }),
    summary: text("summary").notNull(),
    readAt: timestamp("read_at", { withTimezone: true }),
    emailedAt: timestamp("emailed_at", { withTimezone: true }),
    createdAt: timestamp("created_at", { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [
    index("notifications_user_part_idx").on(t.userId, t.partId, t.readAt),
    // Batching looks for e-mail not yet sent per recipient and part.
    index("notifications_pending_email_idx").on(t.userId, t.partId).where(sql`${t.emailedAt} is null`),
  ],
);

export type Share = typeof shares.$inferSelect;
export type Comment = typeof comments.$inferSelect;
export type Proposal = typeof proposals.$inferSelect;
export type Notification = typeof notifications.$inferSelect;
